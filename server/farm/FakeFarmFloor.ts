/**
 * The simulated shop floor of the local fake farm: work orders move through their stages on a simulated clock,
 * injected faults hold, fail or lose things, and every move is sent as a signed notice. Kept in memory: the fake
 * stands in for a service with its own storage, so it outlives our server only when run as its own process.
 */
import { randomBytes, randomInt } from 'node:crypto';
import type {
  FarmFaults,
  FarmNotice,
  PrintFile,
  WorkOrder,
  WorkOrderInput,
  WorkOrderStage,
} from '../../shared/schemas/farm';
import { NOTICE_SIGNATURE_HEADER, NOTICE_TIMESTAMP_HEADER, signNotice } from './farmSignature';

/** Simulated seconds each stage takes (printing: per unit, plus one unit's time per reprinted plate). */
export const FAKE_STAGE_SECONDS = { accepted: 60, scheduled: 300, printingPerUnit: 2400, packing: 900 } as const;

/** Invented carriers the fake hands parcels to (tracking pages on the reserved .example domain). */
const CARRIERS = [
  { name: 'Parcelway', prefix: 'PW', url: 'https://track.parcelway.example/' },
  { name: 'Hedgerow Post', prefix: 'HP', url: 'https://hedgerow-post.example/track/' },
];

interface FloorOrder {
  order: WorkOrder;
  /** Simulated time of the next move. */
  dueAtS: number;
}

/** Options of {@link FakeFarmFloor}. */
export interface FakeFarmFloorOptions {
  /** Simulated seconds per real second. */
  speed: number;
  /** Where notices go (may be set later). */
  noticeUrl?: string;
  noticeSecret: string;
}

/** Counters tests read through `GET /v1/test-faults`. */
export interface FloorCounters {
  noticesSent: number;
  noticesLost: number;
  workOrdersCreated: number;
  filesStored: number;
}

/** The fake farm's state and clock. */
export class FakeFarmFloor {
  readonly files = new Map<string, PrintFile & { body: Buffer }>();
  readonly orders = new Map<string, FloorOrder>();
  readonly idempotency = new Map<string, { bodyKey: string; id: string }>();
  faults: Required<Omit<FarmFaults, 'rejectAddressesMatching'>> & { rejectAddressesMatching: string | null } = {
    down: false,
    rejectAddressesMatching: null,
    outOfStock: [],
    failPrints: 0,
    loseNotices: 0,
    throttle: 0,
  };
  readonly counters: FloorCounters = { noticesSent: 0, noticesLost: 0, workOrdersCreated: 0, filesStored: 0 };
  noticeUrl: string | undefined;
  private simS = 0;
  private lastRealMs = Date.now();
  private timer: NodeJS.Timeout | undefined;
  private readonly pending: Array<{ body: string; tries: number }> = [];
  private sending = false;

  /** @param options - clock speed, notice address and secret */
  constructor(private readonly options: FakeFarmFloorOptions) {
    this.noticeUrl = options.noticeUrl;
  }

  /** Starts the clock (ticks every 50 ms of real time). */
  start(): void {
    this.lastRealMs = Date.now();
    this.timer = setInterval(() => this.tick(), 50);
    this.timer.unref();
  }

  /** Stops the clock; undelivered notices are dropped. */
  stop(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = undefined;
    this.pending.length = 0;
  }

  /**
   * Accepts a work order (already validated) and returns it.
   * @param input - the studio's work order
   */
  create(input: WorkOrderInput): WorkOrder {
    const now = this.nowIso();
    const order: WorkOrder = {
      id: `wo_${randomBytes(6).toString('hex')}`,
      reference: input.reference,
      kind: input.kind,
      stage: 'accepted',
      stageChangedAt: now,
      hold: null,
      lines: input.lines.map((line) => ({ ...line, printed: 0, reprints: 0 })),
      shipTo: input.shipTo,
      parcel: null,
      log: [{ at: now, stage: 'accepted', note: 'work order received' }],
      createdAt: now,
    };
    this.orders.set(order.id, { order, dueAtS: this.simS + FAKE_STAGE_SECONDS.accepted });
    this.counters.workOrdersCreated++;
    this.notify('stage_changed', order);
    return order;
  }

  /**
   * Withdraws a work order that has not started printing; undefined when it cannot be withdrawn any more.
   * @param id - the work order
   */
  withdraw(id: string): WorkOrder | undefined {
    const entry = this.orders.get(id);
    if (!entry || !['accepted', 'scheduled', 'on_hold'].includes(entry.order.stage)) return undefined;
    this.move(entry, 'withdrawn', 'withdrawn at the studio’s request');
    return entry.order;
  }

  /** Advances the simulated clock by the real time since the last tick and moves every work order that is due. */
  tick(): void {
    const nowMs = Date.now();
    this.simS += ((nowMs - this.lastRealMs) / 1000) * this.options.speed;
    this.lastRealMs = nowMs;
    for (const entry of this.orders.values()) {
      let guard = 0;
      while (entry.dueAtS <= this.simS && guard++ < 10) this.advance(entry);
    }
    void this.flush();
  }

  private advance(entry: FloorOrder): void {
    const { order } = entry;
    const units = order.lines.reduce((sum, line) => sum + line.quantity, 0);
    switch (order.stage) {
      case 'accepted': {
        const hold = this.holdFor(order);
        if (hold) {
          order.hold = hold;
          this.move(entry, 'on_hold', hold.message, 'hold');
          entry.dueAtS = Infinity;
          return;
        }
        this.move(entry, 'scheduled', 'plates planned and queued');
        entry.dueAtS = this.simS + FAKE_STAGE_SECONDS.scheduled;
        return;
      }
      case 'scheduled':
        this.move(entry, 'printing', `printing ${units} unit(s)`);
        entry.dueAtS = this.simS + FAKE_STAGE_SECONDS.printingPerUnit * units;
        return;
      case 'printing':
        if (this.faults.failPrints > 0) {
          this.faults.failPrints--;
          const line = order.lines[0];
          line.reprints++;
          order.log.push({
            at: this.nowIso(),
            stage: 'printing',
            note: `a plate of ${line.lineRef} failed: printing it again`,
          });
          this.notify('reprint', order);
          entry.dueAtS = this.simS + FAKE_STAGE_SECONDS.printingPerUnit;
          return;
        }
        for (const line of order.lines) line.printed = line.quantity;
        this.move(entry, 'packing', 'printed, inspected and packing');
        entry.dueAtS = this.simS + FAKE_STAGE_SECONDS.packing;
        return;
      case 'packing': {
        const carrier = CARRIERS[order.id.charCodeAt(order.id.length - 1) % CARRIERS.length];
        // Twelve digits, always: two six-digit random halves (a 40-bit number could reach thirteen).
        const trackingCode = `${carrier.prefix}${randomInt(0, 1e6).toString().padStart(6, '0')}${randomInt(0, 1e6).toString().padStart(6, '0')}`;
        order.parcel = { carrier: carrier.name, trackingCode, trackingUrl: `${carrier.url}${trackingCode}` };
        this.move(entry, 'handed_over', `handed to ${carrier.name}, tracking ${trackingCode}`);
        entry.dueAtS = Infinity;
        return;
      }
      default:
        entry.dueAtS = Infinity;
    }
  }

  private holdFor(order: WorkOrder): WorkOrder['hold'] {
    const match = this.faults.rejectAddressesMatching?.toLowerCase();
    const address = `${order.shipTo.line1} ${order.shipTo.postalCode}`.toLowerCase();
    if (match && address.includes(match))
      return { code: 'address_undeliverable', message: 'the carrier cannot deliver to this address' };
    for (const line of order.lines)
      if (this.faults.outOfStock.some((s) => s.material === line.material && s.colour === line.colour))
        return {
          code: 'colour_unavailable',
          message: `${line.material} in ${line.colour} is out of stock (needed for ${line.lineRef})`,
        };
    return null;
  }

  private move(
    entry: FloorOrder,
    stage: WorkOrderStage,
    note: string,
    kind: FarmNotice['kind'] = 'stage_changed',
  ): void {
    const at = this.nowIso();
    entry.order.stage = stage;
    entry.order.stageChangedAt = at;
    entry.order.log.push({ at, stage, note });
    this.notify(kind, entry.order);
  }

  private notify(kind: FarmNotice['kind'], order: WorkOrder): void {
    const notice: FarmNotice = {
      noticeId: `nt_${randomBytes(8).toString('hex')}`,
      kind,
      occurredAt: this.nowIso(),
      workOrder: structuredClone(order),
    };
    if (this.faults.loseNotices > 0) {
      this.faults.loseNotices--;
      this.counters.noticesLost++;
      return;
    }
    this.pending.push({ body: JSON.stringify(notice), tries: 0 });
  }

  /** Sends queued notices in order; a failed delivery is tried again on later ticks, up to five times. */
  private async flush(): Promise<void> {
    if (this.sending || this.faults.down || !this.noticeUrl) return;
    this.sending = true;
    try {
      while (this.pending.length > 0 && !this.faults.down) {
        const next = this.pending[0];
        const timestampS = Math.floor(Date.now() / 1000);
        try {
          const response = await fetch(this.noticeUrl, {
            method: 'POST',
            headers: {
              'content-type': 'application/json',
              [NOTICE_TIMESTAMP_HEADER]: String(timestampS),
              [NOTICE_SIGNATURE_HEADER]: signNotice(this.options.noticeSecret, timestampS, next.body),
            },
            body: next.body,
            signal: AbortSignal.timeout(5000),
          });
          if (!response.ok) throw new Error(`status ${response.status}`);
          this.pending.shift();
          this.counters.noticesSent++;
        } catch {
          next.tries++;
          if (next.tries >= 5) this.pending.shift();
          return;
        }
      }
    } finally {
      this.sending = false;
    }
  }

  /** The simulated time as an ISO string (the fake's clock starts at real time and runs at its speed). */
  private nowIso(): string {
    return new Date(this.startedAtMs + this.simS * 1000).toISOString();
  }

  private readonly startedAtMs = Date.now();
}
