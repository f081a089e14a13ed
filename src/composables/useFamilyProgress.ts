import { onScopeDispose, ref, shallowRef, type Ref } from 'vue';
import type { ZodType } from 'zod';

/** What {@link useFamilyProgress} exposes to a view. */
export interface FamilyProgress<T> {
  /** The latest progress event, or null before the first one. */
  latest: Ref<T | null>;
  /** Whether the event stream is open. */
  open: Ref<boolean>;
  /** A readable problem with the stream (lost connection, unreadable event), or null. */
  error: Ref<string | null>;
  /**
   * Opens the stream at `url` (closing any earlier one).
   * @param url - same-origin URL of the server-sent event stream
   */
  start(url: string): void;
  /** Closes the stream. */
  stop(): void;
}

/** Options of {@link useFamilyProgress}. */
export interface FamilyProgressOptions<T> {
  /** Schema of one event's JSON `data`; events that do not match are reported in `error` and skipped. */
  schema: ZodType<T>;
  /** Names of the SSE events to follow (`event:` lines); unnamed events arrive as `message`. */
  events?: readonly string[];
  /** Whether an event ends the work (the stream is closed after it); `eventName` is the SSE event's name. */
  isFinal: (event: T, eventName: string) => boolean;
  /** Called with every event that matched the schema. */
  onEvent?: (event: T) => void;
}

/**
 * Follows a family's background computation through server-sent events (EventSource): the JSON data of every
 * followed event is checked against the schema and kept in `latest`; the stream closes itself on the final event,
 * on `stop()` and when the calling component's scope ends. EventSource reconnects by itself after a dropped connection; while it
 * does, `error` says so.
 * @param options - event schema, final-event test and an optional listener
 */
export function useFamilyProgress<T>(options: FamilyProgressOptions<T>): FamilyProgress<T> {
  const latest = shallowRef<T | null>(null) as Ref<T | null>;
  const open = ref(false);
  const error = ref<string | null>(null);
  let source: EventSource | null = null;

  function stop(): void {
    source?.close();
    source = null;
    open.value = false;
  }

  function start(url: string): void {
    stop();
    error.value = null;
    const stream = new EventSource(url, { withCredentials: true });
    source = stream;
    open.value = true;
    stream.onopen = () => {
      error.value = null;
    };
    const onEvent = (message: MessageEvent<string>): void => {
      if (source !== stream) return;
      let data: unknown;
      try {
        data = JSON.parse(message.data);
      } catch {
        error.value = 'The server sent a progress message that is not JSON.';
        return;
      }
      const parsed = options.schema.safeParse(data);
      if (!parsed.success) {
        error.value = `The server sent a progress message of an unexpected shape: ${parsed.error.issues[0]?.message ?? 'unknown'}`;
        return;
      }
      latest.value = parsed.data;
      options.onEvent?.(parsed.data);
      if (options.isFinal(parsed.data, message.type)) stop();
    };
    for (const name of options.events ?? ['message']) stream.addEventListener(name, onEvent as EventListener);
    stream.onerror = () => {
      if (stream.readyState === EventSource.CLOSED) {
        error.value = 'The progress stream was closed by the server.';
        if (source === stream) stop();
      } else {
        error.value = 'The connection to the server was lost; trying again…';
      }
    };
  }

  onScopeDispose(stop);
  return { latest, open, error, start, stop };
}
