/**
 * The engine's exactness guard for speed work (#18): every output of the engine for a set of
 * surveys, written as text with NaN, ±Infinity and −0 spelled out, so a change meant only to make
 * the engine faster can be checked to leave every number unchanged to the last bit, not only within
 * the tests' tolerances. The surveys: the bench vessel (4,000 boundaries), a 600-boundary part of it
 * with shores on stiffened bulkheads, stiffened patches and manholes and plating checks, under three
 * attitudes, every condition of the demo survey, the demo survey sent for review, and the demo's
 * flooding forecast. For each: full results with and without load diagrams, the summary with its
 * rows, and the detail of every 37th boundary.
 *
 *   npx tsx scripts/check-engine-exact.ts write .tmp/engine-before.txt   (before the change)
 *   npx tsx scripts/check-engine-exact.ts check .tmp/engine-before.txt   (after: IDENTICAL, or where it differs)
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { boundaryRows, computeBoundaryDetail, computeSurvey, computeSurveySummary, forecastFlooding } from '@shared/engine';
import type { Boundary, Survey } from '@shared/schemas/survey';
import { demoSubmittedSurvey, demoSurvey } from '../seeds/demo-survey';
import { generateVessel } from './bench-engine';

const enc = (_k: string, v: unknown) => (typeof v === 'number' ? (Number.isNaN(v) ? 'NaN' : Object.is(v, -0) ? '-0' : !Number.isFinite(v) ? String(v) : v) : v);

function variants(): [string, Survey][] {
  const v = generateVessel();
  const small = { ...v, compartments: v.compartments, boundaries: v.boundaries.slice(0, 600) };
  // shores on stiffened bulkheads, at many places: on a stiffener, between, near edges, pulled
  let n = 0;
  const sh = (x: number, y: number, z: number, side: 'A' | 'B') => ({ id: `be9c0000-0000-4000-8000-ff${(n++).toString(16).padStart(10, '0')}`, position: { x, y, z }, lengthM: 3, section: { kind: 'rectangular' as const, widthM: 0.15, depthM: 0.15 }, elasticModulusPa: 11e9, allowableStressPa: 8e6, endCondition: 'pinned-pinned' as const, side });
  const boundaries: Boundary[] = small.boundaries.map((b, i) => {
    if (b.stiffening && b.geometry.kind === 'rectangle') {
      const o = b.geometry.origin;
      const k = i % 7;
      const shores = [sh(o.x, o.y + 0.7, o.z + 3, 'B'), sh(o.x, o.y + 1.05, o.z + 5, k % 2 ? 'A' : 'B'), sh(o.x, o.y + 1.4 + 0.01 * k, o.z + 2 + k, 'B'), sh(o.x, o.y + 0.1, o.z + 4, 'B'), sh(o.x, o.y + 1.9, o.z + 8, 'A')].slice(0, 1 + k);
      return { ...b, shores, stiffening: { ...b.stiffening, endFixity: k % 3 === 0 ? 'fixed' : 'simply-supported', ...(k === 4 ? { spanM: 6 } : {}), ...(k === 5 ? { firstOffsetM: 0.2 } : {}) }, plating: { thicknessM: 0.012, yieldStressPa: 235e6, allowableStressPa: 188e6, edges: k % 2 ? 'fixed' : 'simply-supported' } } as Boundary;
    }
    if (b.kind === 'patch' && i % 3 === 0) return { ...b, stiffening: { direction: { x: 1, y: 0, z: 0 }, spacingM: 0.4, endFixity: 'fixed', sectionModulusM3: 50e-6, allowableStressPa: 160e6 } } as Boundary;
    if (b.kind === 'manhole' && i % 2 === 0) return { ...b, stiffening: { direction: { x: 1, y: 1, z: 0 }, spacingM: 0.15, endFixity: 'simply-supported', sectionModulusM3: 5e-6, allowableStressPa: 160e6 }, shores: [sh(b.geometry.kind === 'circle' ? b.geometry.centre.x : 0, b.geometry.kind === 'circle' ? b.geometry.centre.y + 0.05 : 0, b.geometry.kind === 'circle' ? b.geometry.centre.z : 0, 'A')], plating: { thicknessM: 0.01, yieldStressPa: 235e6, allowableStressPa: 188e6, edges: 'simply-supported' } } as Boundary;
    if (b.kind === 'manhole') return { ...b, shores: [sh(b.geometry.kind === 'circle' ? b.geometry.centre.x : 0, b.geometry.kind === 'circle' ? b.geometry.centre.y + 0.05 : 0, b.geometry.kind === 'circle' ? b.geometry.centre.z : 0, 'A'), sh(b.geometry.kind === 'circle' ? b.geometry.centre.x : 0, b.geometry.kind === 'circle' ? b.geometry.centre.y - 0.1 : 0, b.geometry.kind === 'circle' ? b.geometry.centre.z : 0, 'A')] } as Boundary;
    return b;
  });
  const shored = { ...small, boundaries };
  const heeled = { ...shored, conditions: [{ ...shored.conditions[0], heelDeg: -12, drafts: { forwardM: 9, aftM: 4 } }] };
  const level = { ...shored, conditions: [{ ...shored.conditions[0], heelDeg: 0, drafts: { forwardM: 7, aftM: 7 } }] };
  const out: [string, Survey][] = [['bench', v], ['shored', shored], ['heeled', heeled], ['level', level]];
  const d = demoSurvey();
  for (const c of d.conditions) out.push([`demo-${c.id}`, { ...d, activeConditionId: c.id }]);
  out.push(['submitted', demoSubmittedSurvey()]);
  return out;
}

const parts: string[] = [];
for (const [name, s] of variants()) {
  const full = computeSurvey(s, { includeLoadDiagrams: true });
  const plain = computeSurvey(s);
  const sum = computeSurveySummary(s);
  const rows = boundaryRows(sum.boundaries);
  const details = s.boundaries.filter((_, i) => i % 37 === 0).map((b) => computeBoundaryDetail(s, b.id));
  parts.push(JSON.stringify({ name, full, plain, sum: { ...sum, boundaries: rows }, details }, enc));
}
const d = demoSurvey();
try { parts.push(JSON.stringify({ forecast: forecastFlooding(d) }, enc)); } catch (e) { parts.push(String(e)); }
const text = parts.join('\n');
const [mode, file] = process.argv.slice(2);
if (mode === 'write' || (mode === 'check' && file && !existsSync(file))) {
  writeFileSync(file, text);
  console.log(`wrote ${file}: ${text.length} characters`);
} else if (mode === 'check' && file) {
  const old = readFileSync(file, 'utf8');
  if (old === text) console.log(`IDENTICAL to ${file}: ${text.length} characters`);
  else {
    const a = old.split('\n'), b = text.split('\n');
    for (let i = 0; i < Math.max(a.length, b.length); i++) {
      if (a[i] === b[i]) continue;
      let k = 0;
      while (k < Math.min(a[i]?.length ?? 0, b[i]?.length ?? 0) && a[i][k] === b[i][k]) k++;
      console.log(`DIFFERENT in part ${i} at character ${k}\nbefore: ${a[i]?.slice(Math.max(0, k - 300), k + 200)}\nafter:  ${b[i]?.slice(Math.max(0, k - 300), k + 200)}`);
    }
    process.exitCode = 1;
  }
} else {
  console.log('usage: npx tsx scripts/check-engine-exact.ts write|check FILE');
  process.exitCode = 2;
}
