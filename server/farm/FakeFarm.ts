/**
 * A local fake print farm for development and tests, speaking our farm protocol (shared/schemas/farm.ts): the app
 * starts one on a free port when FARM_API_URL is unset, as it starts the fake SMTP server. `npx tsx server/farm/fakeFarmMain.ts`
 * runs one as its own process. Faults are injected with `POST /v1/test-faults`.
 */
import { createHash } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import express, { type NextFunction, type Request, type Response } from 'express';
import { FarmFaultsSchema, WorkOrderInputSchema } from '../../shared/schemas/farm';
import { FakeFarmFloor } from './FakeFarmFloor';

/** Largest print file the fake accepts. */
const MAX_FILE_BYTES = 64 * 1024 * 1024;

/** Options of {@link FakeFarm}. */
export interface FakeFarmOptions {
  /** Key callers must send as `Authorization: Bearer <key>`. */
  apiKey: string;
  /** Secret notices are signed with. */
  noticeSecret: string;
  /** Simulated seconds per real second. */
  speed: number;
  /** Where to send notices (can be set later with {@link FakeFarm.setNoticeUrl}). */
  noticeUrl?: string;
}

/** The fake farm: an HTTP server over a {@link FakeFarmFloor}. */
export class FakeFarm {
  readonly floor: FakeFarmFloor;
  private readonly server: Server;
  private portNumber = 0;

  /** @param options - key, notice secret and address, clock speed */
  constructor(private readonly options: FakeFarmOptions) {
    this.floor = new FakeFarmFloor(options);
    this.server = createServer(this.app());
  }

  /** The base address, e.g. `http://127.0.0.1:41234` (after {@link listen}). */
  get url(): string {
    return `http://127.0.0.1:${this.portNumber}`;
  }

  /** @param url - the studio's notice address */
  setNoticeUrl(url: string): void {
    this.floor.noticeUrl = url;
  }

  /**
   * Listens on localhost and starts the clock.
   * @param port - 0 picks a free port
   */
  listen(port = 0): Promise<string> {
    return new Promise((resolve, reject) => {
      this.server.once('error', reject);
      this.server.listen(port, '127.0.0.1', () => {
        this.server.off('error', reject);
        this.portNumber = (this.server.address() as AddressInfo).port;
        this.floor.start();
        resolve(this.url);
      });
    });
  }

  /** Stops the clock and the server. */
  close(): Promise<void> {
    this.floor.stop();
    return new Promise((resolve) => {
      this.server.close(() => resolve());
      this.server.closeAllConnections();
    });
  }

  private app(): express.Express {
    const app = express();
    const floor = this.floor;
    app.disable('x-powered-by');
    const fail = (res: Response, status: number, code: string, message: string) =>
      res.status(status).json({ error: { code, message } });

    // Faults are set even while "down", so a test can bring the farm back.
    app.get('/v1/test-faults', (_req, res) => {
      res.json({ faults: floor.faults, counters: floor.counters });
    });
    app.post('/v1/test-faults', express.json(), (req, res) => {
      const parsed = FarmFaultsSchema.safeParse(req.body);
      if (!parsed.success) return fail(res, 400, 'bad_faults', parsed.error.issues[0]?.message ?? 'bad faults');
      Object.assign(floor.faults, parsed.data);
      res.json({ faults: floor.faults });
    });

    app.use('/v1', (req: Request, res: Response, next: NextFunction) => {
      if (floor.faults.down) return fail(res, 503, 'unavailable', 'the farm is down for maintenance');
      if (floor.faults.throttle > 0) {
        floor.faults.throttle--;
        res.set('Retry-After', '1');
        return fail(res, 429, 'slow_down', 'too many requests');
      }
      if (req.get('authorization') !== `Bearer ${this.options.apiKey}`)
        return fail(res, 401, 'unauthorised', 'unknown API key');
      next();
    });

    app.put(
      '/v1/print-files/:hash',
      express.raw({ type: () => true, limit: MAX_FILE_BYTES }),
      (req: Request<{ hash: string }>, res) => {
        const hash = req.params.hash;
        if (!/^[0-9a-f]{64}$/.test(hash)) return fail(res, 400, 'bad_hash', 'a print file is named by a sha256 hash');
        const existing = floor.files.get(hash);
        if (existing) return res.status(200).json(publicFile(existing));
        const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
        const format = sniffFormat(body);
        if (!format) return fail(res, 415, 'not_a_print_file', 'send a binary or text STL, or a 3MF package');
        const file = { meshSha256: hash, format, bytes: body.length, receivedAt: new Date().toISOString(), body };
        floor.files.set(hash, file);
        floor.counters.filesStored++;
        res.status(201).json(publicFile(file));
      },
    );
    app.get('/v1/print-files/:hash', (req: Request<{ hash: string }>, res) => {
      const file = floor.files.get(req.params.hash);
      if (!file) return fail(res, 404, 'no_such_file', 'no print file with this hash');
      res.json(publicFile(file));
    });

    app.post('/v1/work-orders', express.json({ limit: '1mb' }), (req, res) => {
      const key = req.get('idempotency-key');
      if (!key || key.length > 200) return fail(res, 400, 'idempotency_key_required', 'send an Idempotency-Key');
      const parsed = WorkOrderInputSchema.safeParse(req.body);
      if (!parsed.success) {
        const issue = parsed.error.issues[0];
        return fail(res, 400, 'bad_work_order', `${issue?.path.join('.')}: ${issue?.message}`);
      }
      const bodyKey = createHash('sha256').update(JSON.stringify(parsed.data)).digest('hex');
      const seen = floor.idempotency.get(key);
      if (seen) {
        if (seen.bodyKey !== bodyKey)
          return fail(res, 409, 'idempotency_key_reused', 'this key was used for a different work order');
        const entry = floor.orders.get(seen.id);
        if (entry) return res.status(200).json(entry.order);
      }
      const missing = parsed.data.lines.find((line) => !floor.files.has(line.meshSha256));
      if (missing)
        return fail(res, 422, 'missing_print_file', `no print file ${missing.meshSha256} for ${missing.lineRef}`);
      const order = floor.create(parsed.data);
      floor.idempotency.set(key, { bodyKey, id: order.id });
      res.status(201).json(order);
    });
    app.get('/v1/work-orders', (req, res) => {
      const reference = typeof req.query.reference === 'string' ? req.query.reference : undefined;
      const list = [...floor.orders.values()].map((entry) => entry.order);
      res.json({ workOrders: reference ? list.filter((order) => order.reference === reference) : list });
    });
    app.get('/v1/work-orders/:id', (req: Request<{ id: string }>, res) => {
      const entry = floor.orders.get(req.params.id);
      if (!entry) return fail(res, 404, 'no_such_work_order', 'no work order with this id');
      res.json(entry.order);
    });
    app.post('/v1/work-orders/:id/withdraw', (req: Request<{ id: string }>, res) => {
      if (!floor.orders.has(req.params.id)) return fail(res, 404, 'no_such_work_order', 'no work order with this id');
      const order = floor.withdraw(req.params.id);
      if (!order) return fail(res, 409, 'too_late', 'printing has started: the work order can no longer be withdrawn');
      res.json(order);
    });
    app.use((_req: Request, res: Response) => fail(res, 404, 'no_such_route', 'no such route'));
    return app;
  }
}

function publicFile(file: { meshSha256: string; format: 'stl' | '3mf'; bytes: number; receivedAt: string }) {
  return { meshSha256: file.meshSha256, format: file.format, bytes: file.bytes, receivedAt: file.receivedAt };
}

/** 3MF is a zip package (PK); binary STL is 84+ bytes with a matching triangle count; text STL starts "solid". */
function sniffFormat(body: Buffer): 'stl' | '3mf' | undefined {
  if (body.length >= 4 && body[0] === 0x50 && body[1] === 0x4b) return '3mf';
  if (body.length >= 84 && body.length === 84 + body.readUInt32LE(80) * 50) return 'stl';
  if (body.subarray(0, 5).toString('ascii') === 'solid') return 'stl';
  return undefined;
}
