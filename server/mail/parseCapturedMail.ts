/** A captured message reduced to what the admin page shows. */
export interface ParsedMail {
  subject: string;
  text: string;
}

/** Decodes RFC 2047 encoded words (`=?UTF-8?B?...?=`, `=?UTF-8?Q?...?=`) in a header value. */
function decodeWords(value: string): string {
  return value.replace(
    /=\?([^?]+)\?([bBqQ])\?([^?]*)\?=\s*/g,
    (_match, _charset: string, encoding: string, data: string) => {
      if (encoding.toUpperCase() === 'B') return Buffer.from(data, 'base64').toString('utf8');
      return decodeQuotedPrintable(data.replace(/_/g, ' '));
    },
  );
}

/** Decodes quoted-printable text (soft line breaks and =XX bytes) as UTF-8. */
function decodeQuotedPrintable(data: string): string {
  const bytes: number[] = [];
  const text = data.replace(/=\r?\n/g, '');
  for (let i = 0; i < text.length; i++) {
    if (text[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(text.slice(i + 1, i + 3))) {
      bytes.push(parseInt(text.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(...Buffer.from(text[i], 'utf8'));
  }
  return Buffer.from(bytes).toString('utf8');
}

/**
 * Reads the subject and the plain-text body of a single-part message as nodemailer writes it for a text-only mail
 * (7bit, quoted-printable or base64 transfer encoding). Multipart messages keep their raw body.
 * @param raw - the message as received over SMTP
 */
export function parseCapturedMail(raw: string): ParsedMail {
  const split = raw.search(/\r?\n\r?\n/);
  const head = split < 0 ? raw : raw.slice(0, split);
  const body = split < 0 ? '' : raw.slice(split).replace(/^\r?\n\r?\n/, '');
  const headers = new Map<string, string>();
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  const encoding = (headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  let text = body;
  if (encoding === 'base64') text = Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
  else if (encoding === 'quoted-printable') text = decodeQuotedPrintable(body);
  return { subject: decodeWords(headers.get('subject') ?? ''), text: text.replace(/\r\n/g, '\n').trimEnd() };
}
