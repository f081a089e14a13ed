/**
 * Signing of farm notices: HMAC-SHA256 with the shared notice secret over `<timestamp>\n<raw body>`, sent as the
 * headers `Farm-Notice-Timestamp` (Unix seconds) and `Farm-Notice-Signature` (`hmac-sha256=<hex>`). A receiver
 * checks the signature over the exact bytes it received and refuses timestamps outside its replay window.
 */
import { createHmac, timingSafeEqual } from 'node:crypto';

/** Header carrying the Unix time (seconds) the notice was signed at. */
export const NOTICE_TIMESTAMP_HEADER = 'farm-notice-timestamp';
/** Header carrying the signature. */
export const NOTICE_SIGNATURE_HEADER = 'farm-notice-signature';
/** How far a notice's timestamp may be from our clock (5 minutes: common practice for signed callbacks). */
export const NOTICE_REPLAY_WINDOW_S = 300;

/**
 * The signature header value for a body signed at a time.
 * @param secret - the shared notice secret
 * @param timestampS - Unix seconds
 * @param rawBody - the exact bytes sent
 */
export function signNotice(secret: string, timestampS: number, rawBody: string | Buffer): string {
  const mac = createHmac('sha256', secret);
  mac.update(`${timestampS}\n`);
  mac.update(rawBody);
  return `hmac-sha256=${mac.digest('hex')}`;
}

/** Why a notice was refused. */
export type NoticeCheck = { ok: true } | { ok: false; reason: string };

/**
 * Checks a received notice's signature and timestamp.
 * @param secret - the shared notice secret
 * @param headers - the timestamp and signature header values as received
 * @param rawBody - the exact bytes received
 * @param nowS - our clock, Unix seconds
 * @param windowS - the replay window
 */
export function verifyNotice(
  secret: string,
  headers: { timestamp?: string; signature?: string },
  rawBody: Buffer,
  nowS = Math.floor(Date.now() / 1000),
  windowS = NOTICE_REPLAY_WINDOW_S,
): NoticeCheck {
  if (!headers.timestamp || !/^\d{1,12}$/.test(headers.timestamp))
    return { ok: false, reason: 'the notice has no valid timestamp' };
  if (!headers.signature) return { ok: false, reason: 'the notice is not signed' };
  const timestampS = Number(headers.timestamp);
  if (Math.abs(nowS - timestampS) > windowS)
    return { ok: false, reason: 'the notice is too old or from the future (replay window exceeded)' };
  const expected = Buffer.from(signNotice(secret, timestampS, rawBody));
  const given = Buffer.from(headers.signature);
  if (expected.length !== given.length || !timingSafeEqual(expected, given))
    return { ok: false, reason: 'the notice signature does not match' };
  return { ok: true };
}
