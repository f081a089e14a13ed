/**
 * Parses an `application/x-www-form-urlencoded` body with bracketed keys (`line_items[0][price_data][currency]=eur`)
 * into nested objects and arrays, the encoding the payment SDK sends.
 * @param body - the raw body
 */
export function parseFormBody(body: string): Record<string, unknown> {
  const root: Record<string, unknown> = {};
  for (const pair of body.split('&')) {
    if (!pair) continue;
    const eq = pair.indexOf('=');
    const rawKey = decode(eq < 0 ? pair : pair.slice(0, eq));
    const value = eq < 0 ? '' : decode(pair.slice(eq + 1));
    const path = rawKey.split('[').map((part) => part.replace(/\]$/, ''));
    let node: Record<string, unknown> | unknown[] = root;
    path.forEach((key, i) => {
      const last = i === path.length - 1;
      const index = /^\d+$/.test(key) ? Number(key) : key;
      const container = node as Record<string | number, unknown>;
      if (last) container[index] = value;
      else {
        container[index] ??= /^\d+$/.test(path[i + 1]) ? [] : {};
        node = container[index] as Record<string, unknown>;
      }
    });
  }
  return root;
}

function decode(text: string): string {
  return decodeURIComponent(text.replace(/\+/g, ' '));
}
