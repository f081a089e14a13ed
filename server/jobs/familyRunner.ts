/** What the family routes and services need from whichever runner computes families in this app. */
import type { ComputeProgressEvent } from '../../shared/schemas/variant';

/** A progress listener: `done` is true on the last event of a computation. */
export type ProgressListener = (event: ComputeProgressEvent, done: boolean) => void;

/**
 * Computes family revisions in the background. `FamilyJobRunner` does it inside this process (PGlite);
 * `QueuedFamilyRunner` sends one job per variant to the pg-boss queue so every worker process shares a family, and
 * relays progress between processes with PostgreSQL LISTEN/NOTIFY.
 */
export interface FamilyRunner {
  /** Puts every variant of the revision back to pending and queues the computation. */
  enqueue(revisionId: string): Promise<void>;
  /**
   * Stops a queued or running computation.
   * @param record - store the `cancelled` state (false when the caller resets the revision itself)
   * @returns whether something was stopped
   */
  cancel(revisionId: string, record?: boolean): Promise<boolean>;
  /** Listens to the progress of one revision; returns a function that stops listening. */
  subscribe(revisionId: string, listener: ProgressListener): () => void;
  /**
   * Resolves once this process receives progress events (the SSE route awaits it after subscribing, so no event
   * falls between subscribing and reading the current state).
   */
  ready(): Promise<void>;
  /** Whether the revision is queued or being computed (anywhere, for the queued runner). */
  isActive(revisionId: string): Promise<boolean>;
  /** The current progress of a revision, read from the database. */
  progressOf(revisionId: string): Promise<ComputeProgressEvent>;
  /** Resolves when nothing is queued or running (tests and the seed step wait on it). */
  idle(): Promise<void>;
  /** Stops listening and computing in this process. */
  close(): Promise<void>;
}
