/**
 * Engine benchmark: a generated 400-compartment, 4,000-boundary vessel under heel and trim.
 * Prints the median time of computeSurveySummary (the per-edit path), computeSurvey (full detail)
 * and computeBoundaryDetail, and, in the same run, the time and error of a brute-force
 * midpoint-grid quadrature of the same boundaries' net forces at growing grid sizes, up to the
 * first grid whose worst error is within 1e-4 relative; the speed ratio is taken there. The finest
 * grids run on a fixed sample of boundaries and their time is scaled to all of them (stated in the
 * output). A few minutes in all.
 *
 * Honest on a shared host: every figure is given on three clocks (scripts/lib/cpu-clock.ts): wall
 * clock, process CPU time (all threads, the collector's helpers included) and main-thread CPU time,
 * with the load average before and after. On a busy machine the wall clock counts the time other
 * processes held the cores, so the verdicts and the speed ratio use process CPU time for both the
 * engine and the brute force (like for like; the ratio by wall clock is printed beside it).
 * Run: npx tsx scripts/bench-engine.ts [--timing-only]
 */
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { computeBoundaryDetail, computeSurvey, computeSurveySummary, floodWeightsFromResults, responseFromWeights, type SurveyResults } from '@shared/engine';
import { SURVEY_SCHEMA_VERSION, type Boundary, type Compartment, type Contents, type Survey } from '@shared/schemas/survey';
import { pascalPressure } from '../tests/support/pascal';
import { loadWords, median, startStopwatch, timeRuns, type Timings } from './lib/cpu-clock';
import { leanOp, type Entity } from '@shared/sync/apply';
import type { SurveyChange, SurveyOp } from '@shared/schemas/sync';

const uuid = (n: number) => `be9c0000-0000-4000-8000-${n.toString(16).padStart(12, '0')}`;

/**
 * A grid of boxes along a 160 m ship, 10 across, 10 boundaries each: 40 boxes along (the default)
 * give 400 spaces and 4,000 boundaries; 20 give the 200 spaces and 2,000 boundaries of a cargo ship
 * the browser bench and test use.
 */
export function generateVessel({ columns = 40 }: { columns?: number } = {}): Survey {
  let n = 1;
  const condId = uuid(n++);
  const compartments: Compartment[] = [];
  const boundaries: Boundary[] = [];
  const contents: Contents[] = [];
  const NX = columns, NY = 10;
  const dx = 160 / NX, dy = 20 / NY;
  const ids: string[][] = [];
  for (let i = 0; i < NX; i++) {
    ids.push([]);
    for (let j = 0; j < NY; j++) {
      const id = uuid(n++);
      ids[i].push(id);
      const x0 = i * dx, y0 = -10 + j * dy;
      compartments.push({
        id,
        name: `C${i}-${j}`,
        spaceType: (i + j) % 3 === 0 ? 'tank' : 'dry-cargo',
        geometry: { kind: 'box', min: { x: x0, y: y0, z: 1 }, max: { x: x0 + dx, y: y0 + dy, z: 12 } },
      });
      const k = (i * 7 + j * 3) % 5;
      if (k > 0) {
        const layers: Contents['layers'] = [
          { id: uuid(n++), fluidId: 'sea-water', level: { kind: 'sounding', pipe: { x: x0 + 0.5, y: y0 + 0.5, bottomZM: 1 }, soundingM: 1 + k * 1.7 } },
        ];
        if (k === 3) layers.push({ id: uuid(n++), fluidId: 'rmg', level: { kind: 'sounding', pipe: { x: x0 + 0.5, y: y0 + 0.5, bottomZM: 1 }, soundingM: 1.4 + k * 1.7 } });
        contents.push({ compartmentId: id, layers, gas: k === 4 ? { kind: 'pressurised', gaugePressurePa: 15e3 } : { kind: 'vented' } });
      }
    }
  }
  const side = (i: number, j: number): Boundary['sideA'] =>
    i < 0 || i >= NX || j < 0 || j >= NY ? { kind: 'sea' } : { kind: 'compartment', compartmentId: ids[i][j] };
  for (let i = 0; i < NX; i++) {
    for (let j = 0; j < NY; j++) {
      const x0 = i * dx, y0 = -10 + j * dy;
      const me = side(i, j);
      const add = (b: Omit<Boundary, 'id' | 'name'>) => boundaries.push({ id: uuid(n++), name: `B${boundaries.length}`, ...b });
      // forward transverse bulkhead (normal +x), stiffened, with a door set in it (not linked as a child here)
      add({
        kind: 'bulkhead',
        geometry: { kind: 'rectangle', origin: { x: x0 + dx, y: y0, z: 1 }, edgeU: { x: 0, y: dy, z: 0 }, edgeV: { x: 0, y: 0, z: 11 } },
        sideA: me,
        sideB: side(i + 1, j),
        stiffening: { direction: { x: 0, y: 0, z: 1 }, spacingM: 0.7, endFixity: j % 2 === 0 ? 'fixed' : 'simply-supported', sectionModulusM3: 300e-6, allowableStressPa: 160e6 },
      });
      // port longitudinal bulkhead (normal +y)
      add({
        kind: 'bulkhead',
        geometry: { kind: 'rectangle', origin: { x: x0, y: y0 + dy, z: 1 }, edgeU: { x: 0, y: 0, z: 11 }, edgeV: { x: dx, y: 0, z: 0 } },
        sideA: me,
        sideB: side(i, j + 1),
        ratedCapacity: { kind: 'pressure', pressurePa: 120e3 },
      });
      // deck (normal +z) and tank top (normal −z towards the double bottom, taken as air)
      add({ kind: 'deck', geometry: { kind: 'rectangle', origin: { x: x0, y: y0, z: 12 }, edgeU: { x: dx, y: 0, z: 0 }, edgeV: { x: 0, y: dy, z: 0 } }, sideA: me, sideB: { kind: 'air' } });
      add({ kind: 'tank-top', geometry: { kind: 'rectangle', origin: { x: x0, y: y0, z: 1 }, edgeU: { x: 0, y: dy, z: 0 }, edgeV: { x: dx, y: 0, z: 0 } }, sideA: me, sideB: { kind: 'air' } });
      // a door in the transverse bulkhead, a hatch in the deck, a manhole and a patch
      add({ kind: 'door', geometry: { kind: 'rectangle', origin: { x: x0 + dx, y: y0 + 0.3, z: 2 }, edgeU: { x: 0, y: 0.8, z: 0 }, edgeV: { x: 0, y: 0, z: 1.8 } }, sideA: me, sideB: side(i + 1, j), ratedCapacity: { kind: 'pressure', pressurePa: 60e3 } });
      add({ kind: 'hatch-cover', geometry: { kind: 'rectangle', origin: { x: x0 + 0.5, y: y0 + 0.3, z: 12 }, edgeU: { x: 2, y: 0, z: 0 }, edgeV: { x: 0, y: 1.2, z: 0 } }, sideA: me, sideB: { kind: 'air' } });
      add({ kind: 'manhole', geometry: { kind: 'circle', centre: { x: x0 + 2, y: y0 + 1, z: 1 }, normal: { x: 0, y: 0, z: -1 }, radiusM: 0.3 }, sideA: me, sideB: { kind: 'air' }, ratedCapacity: { kind: 'force', forceN: 50e3 } });
      add({ kind: 'manhole', geometry: { kind: 'circle', centre: { x: x0 + dx, y: y0 + 1.4, z: 5 }, normal: { x: 1, y: 0, z: 0 }, radiusM: 0.4 }, sideA: me, sideB: side(i + 1, j) });
      add({
        kind: 'patch',
        geometry: { kind: 'rectangle', origin: { x: x0 + 0.5, y: y0 + dy, z: 3 }, edgeU: { x: 0, y: 0, z: 1.5 }, edgeV: { x: 2, y: 0, z: 0 } },
        sideA: me,
        sideB: side(i, j + 1),
        shores: [
          { id: uuid(n++), position: { x: x0 + 1, y: y0 + dy, z: 3.75 }, lengthM: 3, section: { kind: 'rectangular', widthM: 0.15, depthM: 0.15 }, elasticModulusPa: 11e9, allowableStressPa: 8e6, endCondition: 'pinned-pinned', side: 'B' },
          { id: uuid(n++), position: { x: x0 + 2, y: y0 + dy, z: 3.75 }, lengthM: 3, section: { kind: 'rectangular', widthM: 0.15, depthM: 0.15 }, elasticModulusPa: 11e9, allowableStressPa: 8e6, endCondition: 'pinned-pinned', side: 'B' },
        ],
      });
      // a sloping plate (hopper) as a polygon
      add({
        kind: 'shell',
        geometry: { kind: 'polygon', vertices: [{ x: x0, y: y0, z: 2.5 }, { x: x0, y: y0 + 1.5, z: 1 }, { x: x0 + dx, y: y0 + 1.5, z: 1 }, { x: x0 + dx, y: y0, z: 2.5 }] },
        sideA: side(i, j - 1),
        sideB: me,
      });
    }
  }
  return {
    schemaVersion: SURVEY_SCHEMA_VERSION,
    id: uuid(n++),
    title: 'Benchmark vessel',
    casualtyDescription: 'generated',
    vessel: { name: 'Bench', lbpM: 160, breadthM: 20, depthM: 12, draughtMarks: { forwardXM: 160, aftXM: 0 } },
    conditions: [{ id: condId, time: '2025-01-01T00:00:00Z', drafts: { forwardM: 6.5, aftM: 8.1 }, heelDeg: 3.5, contents }],
    activeConditionId: condId,
    fluids: [],
    compartments,
    boundaries,
  };
}

type V = [number, number, number];

/**
 * Brute force: midpoint rule on an N × N grid over each plate (rectangles: in their own edge
 * coordinates; circles: over the bounding square with an inside test), pressure from Pascal's law
 * point by point using the level elevations the engine reported.
 */
function bruteForces(s: Survey, r: SurveyResults, N: number, indices: readonly number[]): number[] {
  const up: V = [r.frame.up.x, r.frame.up.y, r.frame.up.z];
  const g = r.frame.gravityMS2;
  const layerTops = new Map(r.compartments.map((c) => [c.id, c.layers.map((l) => ({ top: l.levelElevationM, rho: l.densityKgM3 }))]));
  const gasOf = new Map(s.conditions[0].contents.map((c) => [c.compartmentId, c.gas?.kind === 'pressurised' ? c.gas.gaugePressurePa : 0]));
  const sideP = (side: Boundary['sideA'], e: number): number => {
    if (side.kind === 'air') return 0;
    if (side.kind === 'sea') return e < r.frame.waterlineElevationM ? r.frame.seaDensityKgM3 * g * (r.frame.waterlineElevationM - e) : 0;
    return pascalPressure(layerTops.get(side.compartmentId) ?? [], gasOf.get(side.compartmentId) ?? 0, e, g);
  };
  return indices.map((bi) => {
    const b = s.boundaries[bi];
    const geom = b.geometry;
    let F = 0;
    if (geom.kind === 'rectangle' || geom.kind === 'polygon') {
      // bench polygons are parallelograms: origin, edges from vertex 0
      const o: V = geom.kind === 'rectangle' ? [geom.origin.x, geom.origin.y, geom.origin.z] : [geom.vertices[0].x, geom.vertices[0].y, geom.vertices[0].z];
      const eu: V = geom.kind === 'rectangle' ? [geom.edgeU.x, geom.edgeU.y, geom.edgeU.z] : [geom.vertices[1].x - o[0], geom.vertices[1].y - o[1], geom.vertices[1].z - o[2]];
      const ev: V = geom.kind === 'rectangle' ? [geom.edgeV.x, geom.edgeV.y, geom.edgeV.z] : [geom.vertices[3].x - o[0], geom.vertices[3].y - o[1], geom.vertices[3].z - o[2]];
      const cr: V = [eu[1] * ev[2] - eu[2] * ev[1], eu[2] * ev[0] - eu[0] * ev[2], eu[0] * ev[1] - eu[1] * ev[0]];
      const dA = Math.hypot(...cr) / (N * N);
      for (let i = 0; i < N; i++) {
        for (let j = 0; j < N; j++) {
          const a = (i + 0.5) / N, c = (j + 0.5) / N;
          const e = (o[0] + a * eu[0] + c * ev[0]) * up[0] + (o[1] + a * eu[1] + c * ev[1]) * up[1] + (o[2] + a * eu[2] + c * ev[2]) * up[2];
          F += (sideP(b.sideA, e) - sideP(b.sideB, e)) * dA;
        }
      }
    } else if (geom.kind === 'circle') {
      const R = geom.radiusM;
      const nrm: V = [geom.normal.x, geom.normal.y, geom.normal.z];
      const ln = Math.hypot(...nrm);
      const n: V = [nrm[0] / ln, nrm[1] / ln, nrm[2] / ln];
      const t0: V = Math.abs(n[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
      const d = t0[0] * n[0] + t0[1] * n[1] + t0[2] * n[2];
      const e1raw: V = [t0[0] - d * n[0], t0[1] - d * n[1], t0[2] - d * n[2]];
      const l1 = Math.hypot(...e1raw);
      const e1: V = [e1raw[0] / l1, e1raw[1] / l1, e1raw[2] / l1];
      const e2: V = [n[1] * e1[2] - n[2] * e1[1], n[2] * e1[0] - n[0] * e1[2], n[0] * e1[1] - n[1] * e1[0]];
      const h = (2 * R) / N;
      for (let i = 0; i < N; i++) {
        for (let j = 0; j < N; j++) {
          const a = -R + (i + 0.5) * h, c = -R + (j + 0.5) * h;
          if (a * a + c * c > R * R) continue;
          const e = (geom.centre.x + a * e1[0] + c * e2[0]) * up[0] + (geom.centre.y + a * e1[1] + c * e2[1]) * up[1] + (geom.centre.z + a * e1[2] + c * e2[2]) * up[2];
          F += (sideP(b.sideA, e) - sideP(b.sideB, e)) * h * h;
        }
      }
    }
    return F;
  });
}

/** Target: the brute force's worst relative error must reach this before the speed ratio is taken. */
const TARGET_REL_ERROR = 1e-4;

/** Grid sizes tried in turn, and the stride of the boundary sample each uses (1 = every boundary). */
const GRIDS: { n: number; stride: number }[] = [
  { n: 4, stride: 1 },
  { n: 16, stride: 1 },
  { n: 64, stride: 1 },
  { n: 128, stride: 4 },
  { n: 256, stride: 2 },
  { n: 512, stride: 29 },
  { n: 1024, stride: 113 },
];

/** V8's young-generation setting of this process, for the record beside the timings. */
function youngGeneration(): string {
  const flag = process.execArgv.find((a) => a.startsWith('--max-semi-space-size'));
  return flag ? `young generation ${flag}` : "Node's default young generation";
}

const fmt = (ms: number) => `${ms.toFixed(2)} ms`;

function describeTimes(label: string, t: Timings): string {
  const sorted = [...t.wall].sort((a, b) => a - b);
  const thread = t.thread ? `, main thread ${fmt(median(t.thread))}` : '';
  return (
    `${label}, ${t.wall.length} runs, medians: CPU ${fmt(median(t.cpu))} (process, the collector's helper threads included${thread}); ` +
    `wall clock ${fmt(median(t.wall))} (fastest ${fmt(sorted[0])}, 10th percentile ${fmt(sorted[Math.floor(sorted.length / 10)])})`
  );
}

export function main(opts: { timingOnly?: boolean } = {}): void {
  const survey = generateVessel();
  console.log(`Vessel: ${survey.compartments.length} compartments, ${survey.boundaries.length} boundaries (heel 3.5°, trim 1.6 m by the stern); ${youngGeneration()}; ${loadWords()}`);
  // the per-edit path: what the device computes on every edit and the forecast calls repeatedly
  const lean = timeRuns(() => computeSurveySummary(survey), 60);
  const engineCpu = median(lean.cpu), engineWall = median(lean.wall);
  console.log(describeTimes('Engine computeSurveySummary (every load, volume, utilisation and warning; each boundary as a summary row)', lean));
  // the stored results: every boundary in full (sides, parts, stiffener items, shores), no load diagrams
  console.log(describeTimes('Engine computeSurvey (full detail of every boundary, as the server stores it)', timeRuns(() => computeSurvey(survey), 30)));
  console.log(describeTimes('Engine computeBoundaryDetail (one boundary with its load diagram, as the detail view opens it)', timeRuns(() => computeBoundaryDetail(survey, survey.boundaries[0].id), 30)));
  const r = computeSurvey(survey);
  console.log(`  ${loadWords()} after the engine runs: with other work on the cores the wall clock runs ahead of the CPU time`);
  benchPushBytes(survey);
  if (opts.timingOnly) return;
  const exact = r.boundaries.map((b) => b.net.forceN);
  const leanForces = computeSurveySummary(survey).boundaries.forceN;
  if (exact.some((f, i) => f !== leanForces[i])) throw new Error('summary and full results disagree');
  console.log('');
  console.log('Engine error: exact in closed form (rounding only, ~1e-15 relative; tests hold it to 1e-9 on closed-form cases).');
  console.log(`Brute-force midpoint-grid quadrature of the same boundaries' net forces, against the engine, up to the first grid within ${TARGET_REL_ERROR.toExponential(0)}:`);
  console.log('  grid        boundaries   CPU ms (all 4,000)   wall ms   max rel. error   median rel. error   brute force / engine (CPU)');
  let reached: { n: number; cpu: number; wall: number; maxErr: number } | null = null;
  for (const { n, stride } of GRIDS) {
    const indices: number[] = [];
    for (let i = 0; i < survey.boundaries.length; i += stride) indices.push(i);
    const watch = startStopwatch();
    const bf = bruteForces(survey, r, n, indices);
    const sample = watch.stop();
    const scale = survey.boundaries.length / indices.length;
    const cpu = sample.cpu * scale, wall = sample.wall * scale;
    const errs: number[] = [];
    bf.forEach((f, k) => {
      const e = exact[indices[k]];
      if (Math.abs(e) > 1) errs.push(Math.abs(f - e) / Math.max(Math.abs(e), 1));
    });
    const maxErr = Math.max(...errs);
    const scaled = stride > 1 ? `${indices.length} (1 in ${stride}, time scaled)` : `${indices.length}`;
    console.log(
      `  ${`${n}×${n}`.padEnd(11)} ${scaled.padEnd(12)} ${cpu.toFixed(1).padStart(10)}   ${wall.toFixed(1).padStart(10)}       ${maxErr.toExponential(2).padStart(10)}       ${median(errs).toExponential(2).padStart(10)}        ${(cpu / engineCpu).toFixed(0).padStart(10)}×`,
    );
    if (maxErr <= TARGET_REL_ERROR) {
      reached = { n, cpu, wall, maxErr };
      break;
    }
  }
  console.log('');
  if (reached) {
    const ratio = reached.cpu / engineCpu;
    console.log(
      `Speed ratio at equal or better accuracy: the ${reached.n}×${reached.n} grid first reaches a worst error of ${reached.maxErr.toExponential(2)} ` +
        `(≤ ${TARGET_REL_ERROR.toExponential(0)}) in ${reached.cpu.toFixed(0)} ms of CPU for all boundaries; the engine, exact, takes ${fmt(engineCpu)} of CPU (median): ` +
        `${ratio.toFixed(0)}× faster (goal ≥ 5,000×: ${ratio >= 5000 ? 'met' : 'not met'}). By wall clock, taken at different moments of a shared host: ${(reached.wall / engineWall).toFixed(0)}×.`,
    );
  } else {
    console.log(`No grid up to ${GRIDS[GRIDS.length - 1].n}×${GRIDS[GRIDS.length - 1].n} reached ${TARGET_REL_ERROR.toExponential(0)}; the ratio at equal accuracy exceeds the last one printed.`);
  }
  console.log(
    `Engine target < 10 ms median (Node's default heap): ${engineCpu < 10 ? 'met' : 'not met'} on CPU time (${fmt(engineCpu)}); wall clock ${fmt(engineWall)} with the host at ${loadWords()}.`,
  );
  benchShipResponse(survey, r);
}

/**
 * The bytes of the push a one-sounding edit sends (#18 item 3), on the first 2,000 boundaries of the
 * vessel: the lean patch the device store queues, against the whole condition the device used to send.
 */
export function benchPushBytes(vessel: Survey): void {
  const survey = { ...vessel, boundaries: vessel.boundaries.slice(0, 2000) };
  const before = survey.conditions[0];
  const k = before.contents[7];
  const layer = k.layers[0];
  const level = layer.level;
  if (level.kind !== 'sounding') throw new Error('the bench vessel’s layer is not a sounding');
  const edited = { ...layer, level: { ...level, soundingM: (level.soundingM ?? 0) + 0.01 } };
  const after = { ...before, contents: before.contents.map((c) => (c === k ? { ...k, layers: [edited, ...k.layers.slice(1)] } : c)) };
  const body = (op: SurveyOp) => {
    const change: SurveyChange = { id: crypto.randomUUID(), deviceId: crypto.randomUUID(), seq: 1234, surveyId: survey.id, baseRevision: 56, createdAt: new Date().toISOString(), op };
    return new TextEncoder().encode(JSON.stringify({ changes: [change] })).length;
  };
  const whole = body({ kind: 'upsert', collection: 'conditions', entity: after, fields: ['contents'] });
  const lean = body(leanOp(before as unknown as Entity, { kind: 'upsert', collection: 'conditions', entity: after }));
  console.log(`Push of one sounding edit (2,000-boundary survey, ${before.contents.length} spaces with contents): ${lean} bytes as sent (goal < 2 KB: ${lean < 2048 ? 'met' : 'not met'}); the whole condition would be ${whole} bytes.`);
}

/**
 * The ship's response, which a forecast calls at every time step: the flood weights of all 400
 * spaces from the results (a plane section per liquid surface) and responseFromWeights with them,
 * all by added weight and again with ten spaces open to the sea (lost buoyancy, found by Newton's method).
 */
export function benchShipResponse(survey: Survey, r: SurveyResults): void {
  const condition = {
    ...survey.conditions[0],
    stability: {
      particulars: {
        kind: 'booklet' as const,
        displacementT: { value: 12000 },
        meanDraftM: { value: 7.3 },
        kgM: { value: 7 },
        lcgM: { value: 78 },
        tpcT: { value: 30 },
        lcfM: { value: 76 },
        mct1cmTM: { value: 180 },
        kmM: { value: 9 },
      },
    },
  };
  const time = (fn: () => unknown, runs: number) => {
    for (let i = 0; i < 5; i++) fn();
    const t: number[] = [];
    for (let i = 0; i < runs; i++) {
      const t0 = performance.now();
      fn();
      t.push(performance.now() - t0);
    }
    return median(t);
  };
  const weights = floodWeightsFromResults(survey, r);
  const open = weights.map((w, i) => (i % 40 === 0 ? { ...w, openToSea: true } : w));
  const fw = time(() => floodWeightsFromResults(survey, r), 30);
  const rw = time(() => responseFromWeights(survey, condition, weights), 200);
  const ro = time(() => responseFromWeights(survey, condition, open), 200);
  console.log('');
  console.log(`Ship's response (${weights.length} spaces): flood weights from results ${fw.toFixed(2)} ms median; responseFromWeights ${rw.toFixed(3)} ms (added weight), ${ro.toFixed(3)} ms (10 spaces open to the sea).`);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) main({ timingOnly: process.argv.includes('--timing-only') });
