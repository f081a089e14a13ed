/** Fetches one answer as raw bytes (no decompression), for the bare server to repeat. */
import { request } from 'node:http';
import type { RecordedAnswer } from './bareServer';

/** Headers that describe a body and that the bare server repeats. */
const BODY_HEADERS = ['content-type', 'content-encoding', 'etag', 'cache-control', 'vary'];

/**
 * GETs `baseUrl + path` with the given headers and keeps the status, the body headers and the raw body.
 * @param baseUrl - e.g. `http://localhost:3300`
 * @param path - e.g. `/api/catalogue`
 * @param headers - request headers (cookie, accept-encoding)
 */
export function recordAnswer(baseUrl: string, path: string, headers: Record<string, string>): Promise<RecordedAnswer> {
  return new Promise((resolve, reject) => {
    const req = request(new URL(path, baseUrl), { method: 'GET', headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => {
        const kept: Record<string, string> = {};
        for (const name of BODY_HEADERS) {
          const value = res.headers[name];
          if (typeof value === 'string') kept[name] = value;
        }
        resolve({
          path,
          status: res.statusCode ?? 0,
          headers: kept,
          bodyBase64: Buffer.concat(chunks).toString('base64'),
        });
      });
      res.on('error', reject);
    });
    req.on('error', reject);
    req.end();
  });
}
