/**
 * An in-process cache of the published catalogue and of the read answers built from it (the catalogue list and the
 * shop), with strong ETags and a gzip copy made once per answer.
 *
 * What empties it:
 * - {@link catalogueChanged}, called after a change that alters what the catalogue or the shop shows commits
 *   (a publish, a retire or any workflow step, a new photo, new sales settings): the next read sees the change;
 * - a stamp of the tables the catalogue is read from (row counts and newest change times), checked at most once per
 *   {@link STAMP_CHECK_MS}: it catches a change made by another API process on the same PostgreSQL database, or by a
 *   path that does not call {@link catalogueChanged}, within that time.
 */
import { createHash } from 'node:crypto';
import type { OutgoingHttpHeader } from 'node:http';
import { gzipSync } from 'node:zlib';
import type { Request, RequestHandler, Response } from 'express';
import type { Role } from '../../shared/schemas/auth';
import { rememberedSession } from '../auth/sessionCache';
import type { AppContext } from '../context';
import type { Db } from '../db/client';

/** Longest time a change made outside this process takes to empty the cache (ms). */
export const STAMP_CHECK_MS = 1000;

/** Most answers kept (one per distinct query); past it the answers are dropped and built again on demand. */
const MAX_ANSWERS = 500;

/** Answers smaller than this are sent as they are (gzip would gain little; the compression middleware leaves them too). */
const GZIP_MIN_BYTES = 1024;

/** Headers of a sent answer that are not repeated: set per connection or per request by Node, or per person. */
const UNREPEATED_HEADERS = new Set(['set-cookie', 'date', 'connection', 'keep-alive', 'content-length']);

/** One JSON answer, serialised once. */
export interface CachedAnswer {
  /** The JSON text as UTF-8 bytes. */
  json: Buffer;
  /** Strong ETag of the JSON bytes (quoted). */
  etag: string;
  /** The gzip copy, made on the first request that accepts it. */
  gzip?: Buffer;
  /** The cache's generation when the answer began to be built (an answer older than the cache is not repeated). */
  generation: number;
}

/**
 * An answer exactly as it was sent (status 200): every header the middleware chain and the route set, and the body.
 * {@link repeatSentAnswers} sends it again to the same URL asked with the same Accept-Encoding, before the chain.
 */
interface SentAnswer {
  /** Header names and values in one list (name, value, name, value...) for `writeHead`, Content-Length included. */
  headers: OutgoingHttpHeader[];
  /** The same without Content-Encoding and Content-Length: the headers of a 304. */
  notModifiedHeaders: OutgoingHttpHeader[];
  body: Buffer;
  etag: string;
  /** Roles allowed to read it (any one of them); undefined = public. */
  roles?: readonly Role[];
}

interface CacheState {
  /** Counts the times the cache was emptied. */
  generation: number;
  stamp?: string;
  stampCheckedAt: number;
  stampCheck?: Promise<void>;
  values: Map<string, Promise<unknown>>;
  answers: Map<string, Promise<CachedAnswer>>;
  /** Keyed by {@link sentKey}. */
  sent: Map<string, SentAnswer>;
}

const states = new WeakMap<Db, CacheState>();

function stateOf(db: Db): CacheState {
  let state = states.get(db);
  if (!state) {
    state = { generation: 0, stampCheckedAt: 0, values: new Map(), answers: new Map(), sent: new Map() };
    states.set(db, state);
  }
  return state;
}

/**
 * Empties the cache of a database: call it after a change that alters the published catalogue, the shop's products
 * or its prices has committed.
 * @param db - the database the change was written to (`ctx.db`)
 */
export function catalogueChanged(db: Db): void {
  const state = stateOf(db);
  forgetAnswers(state);
  // The stamp is read again on the next read, so that this change is not taken for another one later.
  state.stampCheckedAt = 0;
}

function forgetAnswers(state: CacheState): void {
  state.generation++;
  state.values.clear();
  state.answers.clear();
  state.sent.clear();
}

/** Counts and newest change times of every table a catalogue or shop answer is built from. */
const STAMP_SQL = `select concat_ws('|',
  (select count(*) || ':' || coalesce(max(updated_at)::text, '') from families),
  (select count(*) || ':' || coalesce(max(updated_at)::text, '') from family_revisions),
  (select count(*) || ':' || coalesce(max(updated_at)::text, '') from family_variants),
  (select count(*) || ':' || coalesce(max(created_at)::text, '') from family_photos),
  (select count(*) || ':' || coalesce(max(at)::text, '') from family_acknowledgements),
  (select count(*) || ':' || coalesce(max(updated_at)::text, '') from sales_settings)) as stamp`;

/** Reads the stamp when it is older than {@link STAMP_CHECK_MS} and empties the cache when it moved. */
async function checkStamp(ctx: AppContext, state: CacheState): Promise<void> {
  if (performance.now() - state.stampCheckedAt < STAMP_CHECK_MS) return;
  state.stampCheck ??= (async () => {
    try {
      const checkedAt = performance.now();
      const { rows } = await ctx.pg.query<{ stamp: string }>(STAMP_SQL);
      const stamp = rows[0]?.stamp ?? '';
      if (state.stamp !== undefined && stamp !== state.stamp) forgetAnswers(state);
      state.stamp = stamp;
      state.stampCheckedAt = checkedAt;
    } finally {
      state.stampCheck = undefined;
    }
  })();
  await state.stampCheck;
}

/** Keeps a promise in a map, and forgets it when it fails (so a failure is not cached). */
function remember<T>(map: Map<string, Promise<T>>, key: string, build: () => Promise<T>): Promise<T> {
  let promise = map.get(key);
  if (!promise) {
    promise = build();
    map.set(key, promise);
    promise.catch(() => {
      if (map.get(key) === promise) map.delete(key);
    });
  }
  return promise;
}

/**
 * A value built from the published catalogue, built once until the catalogue changes. The value is shared by every
 * caller: treat it as read-only.
 * @param ctx - app context
 * @param key - what the value is (one key per kind of value)
 * @param build - builds the value from the database
 */
export async function cachedCatalogueValue<T>(ctx: AppContext, key: string, build: () => Promise<T>): Promise<T> {
  const state = stateOf(ctx.db);
  await checkStamp(ctx, state);
  return remember(state.values, key, build) as Promise<T>;
}

/**
 * A JSON answer built from the published catalogue, serialised once until the catalogue changes.
 * @param ctx - app context
 * @param key - the answer's identity (route and normalised query)
 * @param build - builds the value to send as JSON
 */
export async function cachedCatalogueAnswer(
  ctx: AppContext,
  key: string,
  build: () => Promise<unknown>,
): Promise<CachedAnswer> {
  const state = stateOf(ctx.db);
  await checkStamp(ctx, state);
  if (state.answers.size >= MAX_ANSWERS && !state.answers.has(key)) state.answers.clear();
  const generation = state.generation;
  return remember(state.answers, key, async () => {
    const json = Buffer.from(JSON.stringify(await build()), 'utf8');
    return { json, etag: `"${createHash('sha256').update(json).digest('base64url').slice(0, 32)}"`, generation };
  });
}

/** Who may read an answer: anybody (`public`), or people holding one of some roles (`private`). */
export type AnswerReaders = { scope: 'public' } | { scope: 'private'; roles: readonly Role[] };

/**
 * Sends a cached answer: 304 when the request's If-None-Match holds its ETag, else the gzip copy when the client
 * accepts it, else the JSON bytes. The answer may be kept by the browser but must be checked again each time.
 * The 200 answer, headers and body as sent, is kept for {@link repeatSentAnswers}.
 * @param ctx - app context
 * @param req - the request
 * @param res - the response
 * @param answer - the cached answer
 * @param readers - `public` for the shop; `private` with the roles the route lets in for answers that need a sign-in
 */
export function sendCachedAnswer(
  ctx: AppContext,
  req: Request,
  res: Response,
  answer: CachedAnswer,
  readers: AnswerReaders,
): void {
  res.set({
    'Content-Type': 'application/json; charset=utf-8',
    ETag: answer.etag,
    'Cache-Control': `${readers.scope}, no-cache`,
  });
  res.vary('Accept-Encoding');
  if (req.fresh) {
    res.status(304).end();
    return;
  }
  let body = answer.json;
  if (answer.json.length >= GZIP_MIN_BYTES && req.acceptsEncodings('gzip') === 'gzip') {
    answer.gzip ??= gzipSync(answer.json);
    res.set('Content-Encoding', 'gzip');
    body = answer.gzip;
  }
  // A plain answer of 1 KB or more may still be encoded by the compression middleware (brotli, deflate): not kept.
  if (body !== answer.json || answer.json.length < GZIP_MIN_BYTES) keepSentAnswer(ctx, req, res, answer, body, readers);
  res.send(body);
}

/** The key of a sent answer: the URL as asked and the Accept-Encoding header as sent (same header, same choice). */
function sentKey(req: Request): string {
  return `${req.headers['accept-encoding'] ?? ''}\n${req.originalUrl}`;
}

/** Keeps a 200 answer as it is about to be sent (every header set so far, and the body). */
function keepSentAnswer(
  ctx: AppContext,
  req: Request,
  res: Response,
  answer: CachedAnswer,
  body: Buffer,
  readers: AnswerReaders,
): void {
  const state = stateOf(ctx.db);
  if (req.method !== 'GET' || res.statusCode !== 200 || answer.generation !== state.generation) return;
  const headers: Array<[string, OutgoingHttpHeader]> = [];
  // Names as Node keeps them (lower case; HTTP header names are case-insensitive, RFC 9110 §5.1).
  for (const name of res.getHeaderNames()) {
    const value = res.getHeader(name);
    if (value !== undefined && !UNREPEATED_HEADERS.has(name)) headers.push([name, value]);
  }
  if (state.sent.size >= MAX_ANSWERS) state.sent.clear();
  state.sent.set(sentKey(req), {
    headers: [...headers, ['content-length', body.length] as [string, number]].flat(),
    notModifiedHeaders: headers.filter(([name]) => name !== 'content-encoding').flat(),
    body,
    etag: answer.etag,
    roles: readers.scope === 'private' ? readers.roles : undefined,
  });
}

/**
 * Middleware mounted first: sends again an answer kept by {@link sendCachedAnswer} for the same URL and
 * Accept-Encoding, with the same headers and bytes (or a 304 with the same headers), without running the middleware
 * chain (compression, security headers, body parser, session, validation, the route). It answers only when it can
 * answer exactly as the chain would:
 * - the cache is current: when the stamp is due it is checked first, as the chain would (and a change empties it);
 * - a private answer needs a session remembered by ../auth/sessionCache whose person holds one of its roles, and a
 *   session cookie that is not remembered always goes through the chain (which validates it, renews or clears it).
 * Anything else (other methods, other URLs, a session to validate) goes on to the chain unchanged.
 * @param ctx - app context
 */
export function repeatSentAnswers(ctx: AppContext): RequestHandler {
  return async (req, res, next) => {
    const state = states.get(ctx.db);
    const key = req.method === 'GET' && state?.sent.size ? sentKey(req) : undefined;
    if (!state || key === undefined || !state.sent.has(key)) {
      next();
      return;
    }
    if (state.stampCheck || performance.now() - state.stampCheckedAt >= STAMP_CHECK_MS) {
      // The same check the chain would make before answering; a failure is left to the chain to report.
      const checked = await checkStamp(ctx, state).then(
        () => true,
        () => false,
      );
      if (!checked) {
        next();
        return;
      }
    }
    const sent = state.sent.get(key);
    if (!sent) {
      next();
      return;
    }
    const cookie = req.headers.cookie;
    const sessionId = cookie ? ctx.lucia.readSessionCookie(cookie) : null;
    const person = sessionId ? rememberedSession(ctx.db, sessionId) : undefined;
    if ((sessionId && !person) || (sent.roles && !person?.roles.some((role) => sent.roles?.includes(role)))) {
      next();
      return;
    }
    if (isFresh(req, sent.etag)) {
      res.writeHead(304, sent.notModifiedHeaders);
      res.end();
      return;
    }
    res.writeHead(200, sent.headers);
    res.end(sent.body);
  };
}

/**
 * Whether the request's If-None-Match holds the ETag, as Express's `req.fresh` decides it for an answer without
 * Last-Modified: `Cache-Control: no-cache` in the request asks for the full answer, `*` matches any, and a weak
 * `W/` form of the tag matches too (RFC 9110 §13.1.2, weak comparison).
 */
function isFresh(req: Request, etag: string): boolean {
  const match = req.headers['if-none-match'];
  if (!match) return false;
  const cacheControl = req.headers['cache-control'];
  if (cacheControl && /(?:^|,)\s*no-cache\s*(?:,|$)/.test(cacheControl)) return false;
  if (match.trim() === '*') return true;
  return match.split(',').some((tag) => {
    const trimmed = tag.trim();
    return trimmed === etag || trimmed === `W/${etag}`;
  });
}

/**
 * A stable cache key for a route and its parsed query (keys sorted, empty values left out).
 * @param route - e.g. `catalogue`
 * @param query - the parsed query
 */
export function answerKey(route: string, query: object = {}): string {
  const entries = Object.entries(query)
    .filter(([, value]) => value !== undefined && value !== '')
    .sort(([a], [b]) => a.localeCompare(b));
  return `${route}?${JSON.stringify(entries)}`;
}
