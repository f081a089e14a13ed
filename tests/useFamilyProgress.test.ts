/**
 * The family progress stream client: follows the named server-sent events `progress` and `done`, checks each
 * event against the contract schema, closes itself on the final event and with its scope, and reports unreadable
 * events and lost connections without dropping the last good figure. Runs against a stand-in EventSource (no
 * browser); the real stream is exercised by tests/e2e/families.e2e.test.ts. Expected behaviour is our own design,
 * no outside source.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { effectScope } from 'vue';
import { ComputeProgressEventSchema, type ComputeProgressEvent } from '../shared/schemas/variant';
import { useFamilyProgress } from '../src/composables/useFamilyProgress';

class StandInEventSource {
  static readonly CONNECTING = 0;
  static readonly OPEN = 1;
  static readonly CLOSED = 2;
  static created: StandInEventSource[] = [];
  readyState = StandInEventSource.CONNECTING;
  onopen: (() => void) | null = null;
  onerror: (() => void) | null = null;
  private listeners = new Map<string, ((event: MessageEvent<string>) => void)[]>();
  constructor(
    readonly url: string,
    readonly init: EventSourceInit,
  ) {
    StandInEventSource.created.push(this);
  }
  addEventListener(name: string, listener: (event: MessageEvent<string>) => void): void {
    this.listeners.set(name, [...(this.listeners.get(name) ?? []), listener]);
  }
  close(): void {
    this.readyState = StandInEventSource.CLOSED;
  }
  emit(name: string, data: string): void {
    if (this.readyState === StandInEventSource.CLOSED) return;
    for (const listener of this.listeners.get(name) ?? []) listener({ type: name, data } as MessageEvent<string>);
  }
}

function event(state: ComputeProgressEvent['state'], doneCount: number, total = 6): string {
  return JSON.stringify({ familyId: 'f1', revision: 1, state, doneCount, total });
}

function follow(onEvent = vi.fn()) {
  const scope = effectScope();
  const progress = scope.run(() =>
    useFamilyProgress<ComputeProgressEvent>({
      schema: ComputeProgressEventSchema,
      events: ['progress', 'done'],
      isFinal: (e, name) => name === 'done' || !['queued', 'running'].includes(e.state),
      onEvent,
    }),
  )!;
  return { scope, progress, onEvent };
}

beforeEach(() => {
  StandInEventSource.created = [];
  vi.stubGlobal('EventSource', StandInEventSource);
});
afterEach(() => {
  vi.unstubAllGlobals();
});

describe('useFamilyProgress', () => {
  it('keeps the latest progress event and closes on done', () => {
    const { progress, onEvent } = follow();
    progress.start('/api/families/f1/progress');
    const source = StandInEventSource.created[0];
    expect(source.url).toBe('/api/families/f1/progress');
    expect(source.init.withCredentials).toBe(true);
    expect(progress.open.value).toBe(true);

    source.emit('progress', event('running', 0));
    source.emit('progress', event('running', 3));
    expect(progress.latest.value?.doneCount).toBe(3);
    expect(progress.open.value).toBe(true);

    source.emit('done', event('done', 6));
    expect(progress.latest.value).toMatchObject({ state: 'done', doneCount: 6, total: 6 });
    expect(progress.open.value).toBe(false);
    expect(source.readyState).toBe(StandInEventSource.CLOSED);
    expect(onEvent).toHaveBeenCalledTimes(3);
  });

  it('treats a cancelled or failed state as final even on a progress event', () => {
    const { progress } = follow();
    progress.start('/p');
    StandInEventSource.created[0].emit('progress', event('cancelled', 2));
    expect(progress.open.value).toBe(false);
  });

  it('ignores unnamed messages: the server names its events', () => {
    const { progress } = follow();
    progress.start('/p');
    StandInEventSource.created[0].emit('message', event('running', 1));
    expect(progress.latest.value).toBeNull();
  });

  it('reports unreadable and wrongly shaped events and keeps the last good one', () => {
    const { progress } = follow();
    progress.start('/p');
    const source = StandInEventSource.created[0];
    source.emit('progress', event('running', 2));
    source.emit('progress', 'not json');
    expect(progress.error.value).toMatch(/not JSON/);
    source.emit('progress', JSON.stringify({ familyId: 'f1', state: 'running' }));
    expect(progress.error.value).toMatch(/unexpected shape/);
    expect(progress.latest.value?.doneCount).toBe(2);
    expect(progress.open.value).toBe(true);
  });

  it('says when the connection drops and when the server closed it', () => {
    const { progress } = follow();
    progress.start('/p');
    const source = StandInEventSource.created[0];
    source.onerror?.();
    expect(progress.error.value).toMatch(/lost/);
    expect(progress.open.value).toBe(true);
    source.onopen?.();
    expect(progress.error.value).toBeNull();
    source.readyState = StandInEventSource.CLOSED;
    source.onerror?.();
    expect(progress.error.value).toMatch(/closed/);
    expect(progress.open.value).toBe(false);
  });

  it('closes the old stream when started again, and the stream with its scope', () => {
    const { scope, progress } = follow();
    progress.start('/first');
    progress.start('/second');
    const [first, second] = StandInEventSource.created;
    expect(first.readyState).toBe(StandInEventSource.CLOSED);
    first.emit('progress', event('running', 5));
    expect(progress.latest.value).toBeNull();
    scope.stop();
    expect(second.readyState).toBe(StandInEventSource.CLOSED);
    expect(progress.open.value).toBe(false);
  });
});
