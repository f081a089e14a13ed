/**
 * The seed steps a new database runs, in registration order. A later issue adds its demo designs or families with
 * `registerSeedStep({ name, demo: true, run })` in its own module and one import line in ./seedSteps.ts.
 */
import type { Log } from '../context';
import type { Db } from './client';

/** What a seed step receives. */
export interface SeedContext {
  db: Db;
  log: Log;
}

/** One named seed step. */
export interface SeedStep {
  /** Unique name, recorded in `seed_runs` when the step has run. */
  name: string;
  /** True for demo data (skipped when SEED_DEMO=false); false for data every deployment needs. */
  demo: boolean;
  run(seed: SeedContext): Promise<void>;
}

const steps: SeedStep[] = [];

/**
 * Adds a step to the end of the seed list. Names must be unique.
 * @param step - the step
 */
export function registerSeedStep(step: SeedStep): void {
  if (steps.some((existing) => existing.name === step.name))
    throw new Error(`Seed step "${step.name}" is registered twice`);
  steps.push(step);
}

/** The registered steps in order. */
export function registeredSeedSteps(): readonly SeedStep[] {
  return steps;
}
