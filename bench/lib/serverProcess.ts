/**
 * Starts Nestwright processes (an API server the way `npm start` does, a `server/<entry>.ts` under tsx such as
 * `npm run worker`, or any other Node command) and waits for the line that says they are ready. The one way the
 * benches (load, start-up, scaling) and the multi-process tests (scale-out) start processes.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The repository root. */
export const REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '../..');

/** The command `npm start` runs, without npm's own start-up in front (argv after the node executable). */
export const START_ARGS = ['scripts/start.mjs'];

/** The line an API process prints when it listens; its first group is the URL. */
export const API_READY = /Nestwright is ready at (\S+)/;

/** The line `npm run worker` prints when it takes jobs. */
export const WORKER_READY = /is taking jobs/;

/**
 * Node arguments that run `server/<entry>.ts` under tsx (`index` for an API process, `worker` for a worker).
 * @param entry - file name under server/ without `.ts`
 */
export function tsxEntry(entry: string): string[] {
  return ['--import', 'tsx', `server/${entry}.ts`];
}

/** A TCP port that was free a moment ago on 127.0.0.1 (the OS picks it). */
export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
  const { port } = server.address() as { port: number };
  await new Promise<void>((done) => server.close(() => done()));
  return port;
}

/** Options of {@link startProcess}. */
export interface ProcessOptions {
  /** A name for errors and log lines, e.g. `api-1`. */
  label: string;
  /** Node arguments (argv after the node executable), e.g. {@link START_ARGS} or `tsxEntry('worker')`. */
  args: string[];
  /** Environment added to this process's own. */
  env?: Record<string, string>;
  /** The line that says the process is ready; its first group, if any, is given back as `url`. */
  ready: RegExp;
  /** Longest wait for the ready line (ms); the default allows a first start that seeds the demo. */
  timeoutMs?: number;
  /** Print the process's own lines. */
  echo?: boolean;
}

/** A running process. */
export interface ServerProcess {
  /** The ready line's first group (`http://localhost:<port>` for an API process), or '' when it has none. */
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
 * Spawns a process in the repository root and resolves when it prints its ready line (stdout or stderr); rejects
 * with everything it printed when it ends first or is not ready in time (then it is stopped).
 * @param options - see {@link ProcessOptions}
 */
export function startProcess(options: ProcessOptions): Promise<ServerProcess> {
  const started = performance.now();
  const timeoutMs = options.timeoutMs ?? 300_000;
  const child = spawn(process.execPath, options.args, {
    cwd: REPO_ROOT,
    env: { ...process.env, ...options.env },
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
    let ready = false;
    const timer = setTimeout(() => {
      void stop();
      reject(new Error(`${options.label} was not ready within ${timeoutMs} ms:\n${lines.join('\n')}`));
    }, timeoutMs);
    const partial = { stdout: '', stderr: '' };
    const onData = (stream: 'stdout' | 'stderr', chunk: Buffer): void => {
      // A line may arrive in two chunks: keep the unfinished end until its newline comes.
      const parts = (partial[stream] + chunk.toString('utf8')).split('\n');
      partial[stream] = parts.pop() ?? '';
      for (const line of parts) {
        if (!line.trim()) continue;
        lines.push(line);
        if (options.echo) console.log(`  [${options.label}] ${line}`);
        const match = ready ? null : options.ready.exec(line);
        if (match) {
          ready = true;
          clearTimeout(timer);
          resolveReady({ url: match[1] ?? '', readyMs: performance.now() - started, lines, child, stop });
        }
      }
    };
    child.stdout?.on('data', (chunk: Buffer) => onData('stdout', chunk));
    child.stderr?.on('data', (chunk: Buffer) => onData('stderr', chunk));
    child.once('exit', (code, signal) => {
      clearTimeout(timer);
      if (!ready)
        reject(new Error(`${options.label} ended (${signal ?? code}) before it was ready:\n${lines.join('\n')}`));
    });
  });
}

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

/**
 * Spawns an API process (`npm start`'s command unless `args` says otherwise) on DATA_DIR and PORT and resolves when
 * it prints `Nestwright is ready at <url>`.
 * @param options - see {@link ServerProcessOptions}
 */
export function startServerProcess(options: ServerProcessOptions): Promise<ServerProcess> {
  return startProcess({
    label: options.label,
    args: options.args ?? START_ARGS,
    env: { DATA_DIR: options.dataDir, PORT: String(options.port), ...options.env },
    ready: API_READY,
    timeoutMs: options.timeoutMs,
    echo: options.echo,
  });
}
