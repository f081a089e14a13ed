/**
 * A bare Express 5 server that answers recorded answers byte for byte: the yardstick of the load bench. Run as its own
 * process: `node --import tsx bench/lib/bareServer.ts <answers.json>`; it prints `bare server ready at <url>`.
 */
import { readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import express from 'express';

/** One recorded answer: the path it answers, its status, the headers that describe the body, and the body. */
export interface RecordedAnswer {
  path: string;
  status: number;
  headers: Record<string, string>;
  bodyBase64: string;
}

const file = process.argv[2];
if (!file) throw new Error('usage: bareServer.ts <answers.json>');
const answers = JSON.parse(readFileSync(file, 'utf8')) as RecordedAnswer[];
const app = express();
app.disable('x-powered-by');
app.disable('etag');
for (const answer of answers) {
  const body = Buffer.from(answer.bodyBase64, 'base64');
  app.get(answer.path, (_req, res) => {
    res.status(answer.status).set(answer.headers).send(body);
  });
}
const server = app.listen(0, () => {
  console.log(`bare server ready at http://localhost:${(server.address() as AddressInfo).port}`);
});
process.on('SIGTERM', () => server.close(() => process.exit(0)));
