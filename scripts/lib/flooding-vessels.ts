/**
 * The flooding bench's vessels (scripts/bench-flooding.ts), in a module of their own so a profile
 * (`node --cpu-prof` on an esbuild bundle) can build them without the browser half of the bench.
 */
import type { Survey } from '@shared/schemas/survey';
import { generateVessel } from '../bench-engine';

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

/**
 * The bench vessel with 200 of its spaces (the aft 20 rows of 10) joined into one group: a chain
 * (each row end to end, the rows joined at alternate ends) or a grid (every space to its neighbours
 * fore and to port). The other 200 spaces stay as floodingVessel has them.
 */
export function connectedVessel(shape: 'chain' | 'grid'): Survey {
  const s = floodingVessel();
  const NY = 10, ROWS = 20, dx = 4, dy = 2;
  let n = 1;
  const uid = (k: number) => `c0dd0000-0000-4000-8000-${k.toString(16).padStart(12, '0')}`;
  const comps = s.compartments.map((c) => ({ ...c, openings: [...(c.openings ?? [])] }));
  const join = (a: number, b: number, face: 'fore' | 'port') => {
    const i = Math.floor(a / NY), j = a % NY;
    const at = face === 'fore' ? { x: i * dx + dx, y: -10 + j * dy + dy / 2, z: 2.5 } : { x: i * dx + dx / 2, y: -10 + j * dy + dy, z: 2.5 };
    comps[a].openings.push({ id: uid(n++), toCompartmentId: comps[b].id, position: at, areaM2: 0.004, face, size: { kind: 'round', diameterM: 0.0714 } });
  };
  for (let i = 0; i < ROWS; i++) {
    for (let j = 0; j < NY; j++) {
      const k = i * NY + j;
      if (j + 1 < NY) join(k, k + 1, 'port');
      if (i + 1 < ROWS && (shape === 'grid' || j === (i % 2 === 0 ? NY - 1 : 0))) join(k, k + NY, 'fore');
    }
  }
  return { ...s, compartments: comps };
}
