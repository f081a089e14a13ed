/** Answers a request with a stored file, streamed from the file store. */
import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import type { StoredFile } from './FileStore';

/**
 * Streams a stored file as the answer, with its size; a client that goes away mid-download just ends the stream.
 * @param res - the response
 * @param file - the opened file
 * @param headers - more headers (Content-Type defaults to the file's own)
 * @param attachmentName - when given, sent as a download with this file name (ASCII letters, digits, dot, dash and
 *   underscore kept)
 */
export async function sendStoredFile(
  res: Response,
  file: StoredFile,
  headers: Record<string, string> = {},
  attachmentName?: string,
): Promise<void> {
  res.set({ 'Content-Type': file.contentType, 'Content-Length': String(file.sizeBytes), ...headers });
  if (attachmentName)
    res.set('Content-Disposition', `attachment; filename="${attachmentName.replace(/[^A-Za-z0-9._-]/g, '_')}"`);
  await pipeline(file.body, res).catch((err: unknown) => {
    if (!res.headersSent) throw err;
  });
}
