/**
 * Several server processes on one machine (node:cluster): `WORKERS` = a number, or `auto` for one per
 * core; 1 (the default) runs the server in the starting process as before. Workers share the port
 * (the primary hands out connections) and hold nothing another instance needs: every answer is
 * checked against PostgreSQL (caches by stored revision, rate-limit counters in PostgreSQL, device
 * owners never change once claimed), so the same code runs as N processes here or as N machines
 * behind a load balancer. The primary runs migrations once before forking, restarts a worker that
 * dies, and stops them all on SIGINT / SIGTERM.
 */
import cluster, { type Worker } from 'node:cluster';
import os from 'node:os';
import { fileURLToPath } from 'node:url';

/** How many server processes `WORKERS` asks for (at least 1). */
export function workersWanted(env: NodeJS.ProcessEnv = process.env): number {
  const raw = env.WORKERS?.trim();
  if (!raw) return 1;
  if (raw === 'auto') return os.availableParallelism();
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1 || n > 64) throw new Error(`WORKERS must be a whole number from 1 to 64, or "auto"; it is "${raw}".`);
  return n;
}

export interface Workers {
  /** Resolves when every worker is listening. */
  ready: Promise<void>;
  /** Stops every worker (SIGTERM, then SIGKILL after `graceMs`). */
  stop: (graceMs?: number) => Promise<void>;
}

/**
 * Forks `n` workers that each run `server/index.ts` with `env` added to this process's environment
 * (each listens on the same PORT). A worker that exits while the primary is not stopping is replaced
 * after a second.
 */
export function forkWorkers(n: number, env: Record<string, string | undefined>, log: (msg: string) => void): Workers {
  cluster.setupPrimary({ exec: fileURLToPath(new URL('./index.ts', import.meta.url)) });
  let stopping = false;
  const listening: Promise<void>[] = [];
  const fork = (): Worker => {
    const w = cluster.fork({ ...env, BRINELINE_WORKER: '1' });
    w.on('exit', (code, signal) => {
      if (stopping) return;
      log(`worker ${w.process.pid} exited (${signal ?? code}); starting another`);
      setTimeout(() => !stopping && fork(), 1000).unref();
    });
    return w;
  };
  for (let i = 0; i < n; i++) {
    const w = fork();
    listening.push(
      new Promise<void>((resolve, reject) => {
        w.once('listening', () => resolve());
        w.once('exit', (code) => reject(new Error(`a server worker exited with ${code} before listening`)));
      }),
    );
  }
  return {
    ready: Promise.all(listening).then(() => undefined),
    stop: async (graceMs = 5000) => {
      stopping = true;
      const all = Object.values(cluster.workers ?? {}).filter((w): w is Worker => Boolean(w));
      await Promise.all(
        all.map(
          (w) =>
            new Promise<void>((resolve) => {
              if (w.isDead()) return resolve();
              const kill = setTimeout(() => w.process.kill('SIGKILL'), graceMs);
              w.once('exit', () => {
                clearTimeout(kill);
                resolve();
              });
              w.process.kill('SIGTERM');
            }),
        ),
      );
    },
  };
}

/** Whether this process is a server worker forked by `forkWorkers`. */
export const isServerWorker = () => cluster.isWorker && process.env.BRINELINE_WORKER === '1';
