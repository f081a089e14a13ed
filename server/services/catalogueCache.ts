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
import { gzipSync } from 'node:zlib';
import type { Request, Response } from 'express';
import type { AppContext } from '../context';
import type { Db } from '../db/client';

/** Longest time a change made outside this process takes to empty the cache (ms). */
export const STAMP_CHECK_MS = 1000;

/** Most answers kept (one per distinct query); past it the answers are dropped and built again on demand. */
const MAX_ANSWERS = 500;

/** Answers smaller than this are sent as they are (gzip would gain little). */
const GZIP_MIN_BYTES = 1024;

/** One JSON answer, serialised once. */
export interface CachedAnswer {
  /** The JSON text as UTF-8 bytes. */
  json: Buffer;
  /** Strong ETag of the JSON bytes (quoted). */
  etag: string;
  /** The gzip copy, made on the first request that accepts it. */
  gzip?: Buffer;
}

interface CacheState {
  stamp?: string;
  stampCheckedAt: number;
  stampCheck?: Promise<void>;
  values: Map<string, Promise<unknown>>;
  answers: Map<string, Promise<CachedAnswer>>;
}

const states = new WeakMap<Db, CacheState>();

function stateOf(db: Db): CacheState {
  let state = states.get(db);
  if (!state) {
    state = { stampCheckedAt: 0, values: new Map(), answers: new Map() };
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
  state.values.clear();
  state.answers.clear();
  // The stamp is read again on the next read, so that this change is not taken for another one later.
  state.stampCheckedAt = 0;
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
      if (state.stamp !== undefined && stamp !== state.stamp) {
        state.values.clear();
        state.answers.clear();
      }
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
  return remember(state.answers, key, async () => {
    const json = Buffer.from(JSON.stringify(await build()), 'utf8');
    return { json, etag: `"${createHash('sha256').update(json).digest('base64url').slice(0, 32)}"` };
  });
}

/**
 * Sends a cached answer: 304 when the request's If-None-Match holds its ETag, else the gzip copy when the client
 * accepts it, else the JSON bytes. The answer may be kept by the browser but must be checked again each time.
 * @param req - the request
 * @param res - the response
 * @param answer - the cached answer
 * @param scope - `private` for answers that need a sign-in, `public` for the shop
 */
export function sendCachedAnswer(req: Request, res: Response, answer: CachedAnswer, scope: 'private' | 'public'): void {
  res.set({
    'Content-Type': 'application/json; charset=utf-8',
    ETag: answer.etag,
    'Cache-Control': `${scope}, no-cache`,
  });
  res.vary('Accept-Encoding');
  if (req.fresh) {
    res.status(304).end();
    return;
  }
  if (answer.json.length >= GZIP_MIN_BYTES && req.acceptsEncodings('gzip') === 'gzip') {
    answer.gzip ??= gzipSync(answer.json);
    res.set('Content-Encoding', 'gzip');
    res.send(answer.gzip);
    return;
  }
  res.send(answer.json);
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
