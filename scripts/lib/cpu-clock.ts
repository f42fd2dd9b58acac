/**
 * CPU clocks for benchmarks on a shared host. Wall-clock time on a busy machine counts the time
 * other processes held the cores; CPU time counts only our own work. Two clocks:
 * - process CPU (`process.cpuUsage`: every thread of the process, so V8's garbage-collector helper
 *   threads count against the code that made the garbage);
 * - main-thread CPU (Linux: `/proc/self/task/<pid>/schedstat`, nanoseconds on a CPU), the JavaScript
 *   thread alone; null where that file does not exist.
 */
import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';

const SCHEDSTAT = `/proc/self/task/${process.pid}/schedstat`;

function threadCpuNs(): number | null {
  try {
    return Number(readFileSync(SCHEDSTAT, 'utf8').split(' ')[0]);
  } catch {
    return null;
  }
}

export interface Stopwatch {
  /** Milliseconds since start: wall clock, process CPU, main-thread CPU (null where unknown). */
  stop(): { wall: number; cpu: number; thread: number | null };
}

export function startStopwatch(): Stopwatch {
  const th0 = threadCpuNs();
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  return {
    stop() {
      const wall = performance.now() - t0;
      const c = process.cpuUsage(c0);
      const th1 = threadCpuNs();
      return { wall, cpu: (c.user + c.system) / 1000, thread: th0 !== null && th1 !== null ? (th1 - th0) / 1e6 : null };
    },
  };
}

export interface Timings {
  wall: number[];
  cpu: number[];
  thread: number[] | null;
}

/** Each call of f timed on all three clocks, after `warmUp` untimed calls. */
export function timeRuns(f: () => unknown, runs: number, warmUp = 10): Timings {
  for (let i = 0; i < warmUp; i++) f();
  const out: Timings = { wall: [], cpu: [], thread: [] };
  for (let i = 0; i < runs; i++) {
    const w = startStopwatch();
    f();
    const t = w.stop();
    out.wall.push(t.wall);
    out.cpu.push(t.cpu);
    if (t.thread === null) out.thread = null;
    else out.thread?.push(t.thread);
  }
  return out;
}

export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** The 1-minute load average and the number of cores, as printed beside timings. */
export function loadWords(): string {
  const [l1] = loadavg();
  return `load average ${l1.toFixed(2)} on ${availableParallelism()} cores`;
}
