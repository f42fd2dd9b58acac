/**
 * Flooding forecast benchmark: the engine bench's 400-space, 4,000-boundary vessel (scripts/bench-engine.ts)
 * given breaches to the sea along the starboard side, an opening in every fifth transverse bulkhead and
 * a pump in every tenth space, forecast 24 h ahead. Prints the median wall time of forecastFlooding over
 * a few runs, the integrator's steps, the load runs and the volume balance. Goal: < 1 s in Node with
 * default heap settings (`npm run bench -- flooding` runs it that way).
 * Run: npx tsx scripts/bench-flooding.ts
 */
import { loadavg } from 'node:os';
import { forecastFlooding } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import { generateVessel } from './bench-engine';

const uuid = (n: number) => `f1d00000-0000-4000-8000-${n.toString(16).padStart(12, '0')}`;

export function floodingVessel(): Survey {
  const s = generateVessel();
  const NX = 40, NY = 10;
  const dx = 160 / NX, dy = 20 / NY;
  let n = 1;
  const compartments = s.compartments.map((c, k) => {
    const i = Math.floor(k / NY), j = k % NY;
    const x0 = i * dx, y0 = -10 + j * dy;
    const next = { ...c };
    // starboard shell holed in every other space along the side
    if (j === 0 && i % 2 === 0) next.breaches = [{ id: uuid(n++), position: { x: x0 + dx / 2, y: y0, z: 2 }, areaM2: 0.01 + 0.002 * (i % 5), face: 'starboard' as const, size: { kind: 'rectangular' as const, widthM: 0.2, heightM: 0.05 + 0.01 * (i % 5) } }];
    // a holed transverse bulkhead every fifth space
    if ((i + j) % 5 === 0 && i + 1 < NX) next.openings = [{ id: uuid(n++), toCompartmentId: s.compartments[(i + 1) * NY + j].id, position: { x: x0 + dx, y: y0 + dy / 2, z: 3 }, areaM2: 0.005, face: 'fore' as const, size: { kind: 'round' as const, diameterM: 0.08 } }];
    if (k % 10 === 3) next.pumps = [{ id: uuid(n++), name: `P${k}`, capacityM3S: 100 / 3600 }];
    return next;
  });
  return { ...s, compartments };
}

export function main(): void {
  const s = floodingVessel();
  const runs: number[] = [];
  const cpu: number[] = [];
  let last = forecastFlooding(s);
  for (let k = 0; k < 3; k++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    last = forecastFlooding(s);
    const c = process.cpuUsage(c0);
    runs.push(performance.now() - t0);
    cpu.push((c.user + c.system) / 1000);
  }
  runs.sort((a, b) => a - b);
  cpu.sort((a, b) => a - b);
  const ms = runs[Math.floor(runs.length / 2)];
  // on a shared, loaded host the wall time includes waiting for a core; the process's CPU time does not
  const cpuMs = cpu[Math.floor(cpu.length / 2)];
  console.log(
    `Flooding forecast, ${s.compartments.length} spaces / ${s.boundaries.length} boundaries, 24 h: median ${ms.toFixed(0)} ms ` +
      `(runs ${runs.map((r) => r.toFixed(0)).join(', ')} ms; load average ${loadavg()[0].toFixed(2)}); CPU time median ${cpuMs.toFixed(0)} ms.`,
  );
  console.log(
    `  ${last.stats.steps} integrator steps, ${last.stats.evaluations} derivative evaluations, ${last.stats.loadRuns} load runs at ${last.times.length} output times; ` +
      `volume balance ${last.balance.balanceM3.toExponential(2)} m³ (${last.balance.relative.toExponential(2)} relative); ${last.limits.length} boundaries reach their limit.`,
  );
  console.log(`Forecast target < 1 s: ${ms < 1000 ? 'met' : 'not met'} on this run (wall time)${ms >= 1000 && cpuMs < 1000 ? '; met in CPU time, the host is loaded' : ''}.`);
}

if (process.argv[1]?.endsWith('bench-flooding.ts')) main();
