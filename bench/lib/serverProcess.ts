/**
 * Starts a Nestwright API process the way `npm start` does (or with another command) and waits for its ready line.
 * The load and start-up benches use it; a PostgreSQL mode starts several of them on one DATABASE_URL.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The repository root. */
export const REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '../..');

/** The command `npm start` runs, without npm's own start-up in front (argv after the node executable). */
export const START_ARGS = ['scripts/start.mjs'];

/** Options of {@link startServerProcess}. */
export interface ServerProcessOptions {
  /** A name for the log lines, e.g. `api-1`. */
  label: string;
  /** DATA_DIR of the process (PGlite database and files). */
  dataDir: string;
  /** Port to listen on (0 is not allowed: the ready line is read for the URL, but a fixed port is simpler to reuse). */
  port: number;
  /** More environment (e.g. DATABASE_URL, SEED_DEMO). */
  env?: Record<string, string>;
  /** Node arguments instead of {@link START_ARGS}. */
  args?: string[];
  /** Longest wait for the ready line (ms); the default allows a first start that seeds the demo. */
  timeoutMs?: number;
  /** Print the process's own lines. */
  echo?: boolean;
}

/** A running server process. */
export interface ServerProcess {
  /** `http://localhost:<port>` */
  url: string;
  /** Wall time from spawning the process to its ready line (ms). */
  readyMs: number;
  /** Every line the process printed so far. */
  lines: string[];
  /** The child process. */
  child: ChildProcess;
  /** SIGTERM, and wait for the process to end (SIGKILL after 10 s). */
  stop(): Promise<void>;
}

/**
 * Spawns the process and resolves when it prints `Nestwright is ready at <url>`.
 * @param options - see {@link ServerProcessOptions}
 */
export function startServerProcess(options: ServerProcessOptions): Promise<ServerProcess> {
  const started = performance.now();
  const child = spawn(process.execPath, options.args ?? START_ARGS, {
    cwd: REPO_ROOT,
    env: { ...process.env, DATA_DIR: options.dataDir, PORT: String(options.port), ...options.env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const lines: string[] = [];
  const exited = new Promise<void>((resolveExit) => child.once('exit', () => resolveExit()));
  const stop = async (): Promise<void> => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    child.kill('SIGTERM');
    const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
    await exited;
    clearTimeout(timer);
  };
  return new Promise((resolveReady, reject) => {
    const timer = setTimeout(() => {
      void stop();
      reject(
        new Error(`${options.label} was not ready within ${options.timeoutMs ?? 300_000} ms:\n${lines.join('\n')}`),
      );
    }, options.timeoutMs ?? 300_000);
    const onData = (chunk: Buffer): void => {
      for (const line of chunk.toString('utf8').split('\n')) {
        if (!line.trim()) continue;
        lines.push(line);
        if (options.echo) console.log(`  [${options.label}] ${line}`);
        const ready = /Nestwright is ready at (\S+)/.exec(line);
        if (ready) {
          clearTimeout(timer);
          resolveReady({ url: ready[1], readyMs: performance.now() - started, lines, child, stop });
        }
      }
    };
    child.stdout?.on('data', onData);
    child.stderr?.on('data', onData);
    child.once('exit', (code, signal) => {
      clearTimeout(timer);
      reject(new Error(`${options.label} ended (${signal ?? code}) before it was ready:\n${lines.join('\n')}`));
    });
  });
}
