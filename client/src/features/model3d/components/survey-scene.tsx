/**
 * The survey in 3D: compartments as translucent solids, each liquid layer cut at its level plane for
 * the ship's heel and trim, plates coloured by their net pressure, the resultant drawn as an arrow at
 * the centre of pressure, shores as instanced struts, and the outside waterline. A thin view: every
 * number and shape comes from the engine (shared/engine, mesh.ts); this file only draws them.
 * Lazy default export, its own chunk.
 */
import { useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import { Canvas, useThree, type ThreeEvent } from '@react-three/fiber';
import { OrbitControls } from '@react-three/drei';
import * as THREE from 'three';
import type { Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { boundaryPolygons, compartmentSolid, liquidBody, type SurveyResults, type V3 } from '@shared/engine';
import { fmt } from '@client/lib/unit-system';
import { pressureRgb, rgbCss } from './pressure-colour';

export interface SurveySceneProps {
  survey: Survey;
  results: SurveyResults;
  system: UnitSystem;
  selectedId: string | null;
  onSelect: (id: string) => void;
}

type View = 'three-quarter' | 'profile' | 'plan' | 'section';
const VIEWS: { id: View; label: string }[] = [
  { id: 'three-quarter', label: '3/4' },
  { id: 'profile', label: 'Profile' },
  { id: 'plan', label: 'Plan' },
  { id: 'section', label: 'Section' },
];

/** Ship axes (x fwd, y port, z up) → three.js (y up): (x, z, −y). */
const toThree = (p: { x: number; y: number; z: number } | V3): THREE.Vector3 =>
  Array.isArray(p) ? new THREE.Vector3(p[0], p[2], -p[1]) : new THREE.Vector3(p.x, p.z, -p.y);

/** Flat polygons (ship axes) → one triangulated geometry in three.js axes. */
function polygonsGeometry(polys: V3[][]): THREE.BufferGeometry {
  const positions: number[] = [];
  for (const poly of polys) {
    if (poly.length < 3) continue;
    const pts = poly.map((p) => toThree(p));
    const n = new THREE.Vector3();
    for (let i = 0; i < pts.length; i++) {
      const a = pts[i], b = pts[(i + 1) % pts.length];
      n.x += (a.y - b.y) * (a.z + b.z);
      n.y += (a.z - b.z) * (a.x + b.x);
      n.z += (a.x - b.x) * (a.y + b.y);
    }
    if (n.lengthSq() === 0) continue;
    n.normalize();
    const u = new THREE.Vector3().crossVectors(Math.abs(n.y) < 0.9 ? new THREE.Vector3(0, 1, 0) : new THREE.Vector3(1, 0, 0), n).normalize();
    const v = new THREE.Vector3().crossVectors(n, u);
    const flat = pts.map((p) => new THREE.Vector2(p.dot(u), p.dot(v)));
    const tris = THREE.ShapeUtils.triangulateShape(flat, []);
    for (const t of tris) for (const k of t) positions.push(pts[k].x, pts[k].y, pts[k].z);
  }
  const g = new THREE.BufferGeometry();
  g.setAttribute('position', new THREE.Float32BufferAttribute(positions, 3));
  g.computeVertexNormals();
  return g;
}

const LAYER_COLOUR = { water: '#1f6fa3', oil: '#6b4a12', other: '#5b6670' } as const;

interface Drawn {
  compartments: { id: string; solid: THREE.BufferGeometry; edges: THREE.EdgesGeometry; layers: { id: string; geometry: THREE.BufferGeometry; colour: string }[] }[];
  boundaries: { id: string; geometry: THREE.BufferGeometry; colour: THREE.Color; pressurePa: number }[];
  arrows: { id: string; origin: THREE.Vector3; dir: THREE.Vector3; length: number }[];
  shores: { from: THREE.Vector3; to: THREE.Vector3; radius: number }[];
  maxPressurePa: number;
  centre: THREE.Vector3;
  radius: number;
  waterline: { point: THREE.Vector3; normal: THREE.Vector3 };
}

function useDrawn(survey: Survey, results: SurveyResults): Drawn {
  const drawn = useMemo<Drawn>(() => {
    const up: V3 = [results.frame.up.x, results.frame.up.y, results.frame.up.z];
    const byId = new Map(survey.compartments.map((c) => [c.id, c]));
    const compartments = results.compartments.flatMap((cr) => {
      const c = byId.get(cr.id);
      if (!c) return [];
      const solid = polygonsGeometry(compartmentSolid(c.geometry));
      let below = -Infinity;
      const layers = cr.layers.map((l) => {
        const top = l.levelElevationM;
        const geometry = polygonsGeometry(top > below ? liquidBody(c.geometry, up, below, top) : []);
        below = Math.max(below, top);
        return { id: l.layerId, geometry, colour: LAYER_COLOUR[l.category] };
      });
      return [{ id: c.id, solid, edges: new THREE.EdgesGeometry(solid, 20), layers }];
    });
    const mean = (b: SurveyResults['boundaries'][number]) => (b.areaM2 > 0 && b.geometryKind !== 'faceted' ? b.net.forceN / b.areaM2 : 0);
    const maxPressurePa = Math.max(1, ...results.boundaries.map((b) => Math.abs(mean(b))));
    const byBoundary = new Map(survey.boundaries.map((b) => [b.id, b]));
    const boundaries = results.boundaries.flatMap((br) => {
      const b = byBoundary.get(br.id);
      if (!b) return [];
      const p = mean(br);
      return [{ id: br.id, geometry: polygonsGeometry(boundaryPolygons(b.geometry)), colour: new THREE.Color(...pressureRgb(p / maxPressurePa)), pressurePa: p }];
    });
    // frame the spaces modelled (not the whole hull, which may be mostly empty of compartments)
    const box = new THREE.Box3();
    for (const c of compartments) {
      c.solid.computeBoundingBox();
      if (c.solid.boundingBox) box.union(c.solid.boundingBox);
    }
    const v = survey.vessel;
    if (box.isEmpty()) box.setFromPoints([toThree({ x: 0, y: -v.breadthM / 2, z: 0 }), toThree({ x: v.lbpM, y: v.breadthM / 2, z: v.depthM })]);
    const centre = box.getCenter(new THREE.Vector3());
    const radius = Math.max(box.getSize(new THREE.Vector3()).length() / 2, 1);
    const L = radius * 2;
    const maxF = Math.max(1, ...results.boundaries.map((b) => b.net.resultantN));
    const arrows = results.boundaries.flatMap((br) => {
      const cop = br.net.centreOfPressure;
      const f = br.net.forceVector;
      if (!cop || br.net.resultantN <= 0) return [];
      const dir = toThree(f).normalize();
      return [{ id: br.id, origin: toThree(cop), dir, length: L * (0.03 + 0.09 * (br.net.resultantN / maxF)) }];
    });
    const shores = survey.boundaries.flatMap((b) => {
      const br = results.boundaries.find((x) => x.id === b.id);
      if (!br?.normal || !b.shores) return [];
      const n = toThree(br.normal).normalize();
      return b.shores.map((s) => {
        const from = toThree(s.position);
        const dir = s.side === 'B' ? n : n.clone().negate();
        const radius = s.section.kind === 'rectangular' ? Math.max(s.section.widthM, s.section.depthM) / 2 : s.section.kind === 'tube' ? s.section.outerDiameterM / 2 : s.section.leastDimensionM / 2;
        return { from, to: from.clone().addScaledVector(dir, s.lengthM), radius };
      });
    });
    return {
      compartments,
      boundaries,
      arrows,
      shores,
      maxPressurePa,
      centre,
      radius,
      waterline: { point: toThree(results.frame.waterlinePoint), normal: toThree(results.frame.up).normalize() },
    };
  }, [survey, results]);
  useEffect(
    () => () => {
      for (const c of drawn.compartments) {
        c.solid.dispose();
        c.edges.dispose();
        c.layers.forEach((l) => l.geometry.dispose());
      }
      drawn.boundaries.forEach((b) => b.geometry.dispose());
    },
    [drawn],
  );
  return drawn;
}

function CameraRig({ view, centre, radius }: { view: View; centre: THREE.Vector3; radius: number }) {
  const camera = useThree((s) => s.camera);
  const controls = useThree((s) => s.controls) as unknown as { target: THREE.Vector3; update: () => void } | null;
  const invalidate = useThree((s) => s.invalidate);
  useLayoutEffect(() => {
    const r = radius * 1.9;
    const offset =
      view === 'profile'
        ? new THREE.Vector3(0, 0, r)
        : view === 'plan'
          ? new THREE.Vector3(0, r, 0.001)
          : view === 'section'
            ? new THREE.Vector3(r, 0, 0)
            : new THREE.Vector3(r * 0.55, r * 0.45, r * 0.75);
    camera.position.copy(centre).add(offset);
    camera.near = radius / 100;
    camera.far = radius * 20;
    camera.updateProjectionMatrix();
    if (controls) {
      controls.target.copy(centre);
      controls.update();
    } else camera.lookAt(centre);
    invalidate();
  }, [view, centre, radius, camera, controls, invalidate]);
  return null;
}

function Shores({ shores }: { shores: Drawn['shores'] }) {
  const ref = useRef<THREE.InstancedMesh>(null);
  const invalidate = useThree((s) => s.invalidate);
  useLayoutEffect(() => {
    const mesh = ref.current;
    if (!mesh) return;
    const m = new THREE.Matrix4();
    const q = new THREE.Quaternion();
    const yAxis = new THREE.Vector3(0, 1, 0);
    shores.forEach((s, i) => {
      const d = s.to.clone().sub(s.from);
      const len = d.length();
      q.setFromUnitVectors(yAxis, d.clone().normalize());
      m.compose(s.from.clone().addScaledVector(d, 0.5), q, new THREE.Vector3(s.radius, len, s.radius));
      mesh.setMatrixAt(i, m);
    });
    mesh.instanceMatrix.needsUpdate = true;
    invalidate();
  }, [shores, invalidate]);
  if (shores.length === 0) return null;
  return (
    <instancedMesh ref={ref} args={[undefined, undefined, shores.length]} raycast={() => null}>
      <cylinderGeometry args={[1, 1, 1, 10]} />
      <meshStandardMaterial color="#8a5a00" />
    </instancedMesh>
  );
}

function Arrow({ origin, dir, length, colour }: { origin: THREE.Vector3; dir: THREE.Vector3; length: number; colour: string }) {
  const arrow = useMemo(() => new THREE.ArrowHelper(dir, origin, length, colour, length * 0.3, length * 0.15), [origin, dir, length, colour]);
  useEffect(() => () => arrow.dispose(), [arrow]);
  return <primitive object={arrow} raycast={() => null} />;
}

function Scene({ drawn, selectedId, onSelect }: { drawn: Drawn; selectedId: string | null; onSelect: (id: string) => void }) {
  const pick = (e: ThreeEvent<MouseEvent>) => {
    e.stopPropagation();
    // Plates sit on compartment faces: prefer a plate within a hair of the nearest hit.
    const hits = e.intersections.filter((h) => typeof h.object.userData.pickId === 'string');
    if (hits.length === 0) return;
    const nearest = hits[0].distance;
    const plate = hits.find((h) => h.object.userData.kind === 'boundary' && h.distance - nearest < drawn.radius * 0.01);
    onSelect(String((plate ?? hits[0]).object.userData.pickId));
  };
  const wl = drawn.waterline;
  const wlQuat = useMemo(() => new THREE.Quaternion().setFromUnitVectors(new THREE.Vector3(0, 0, 1), wl.normal), [wl.normal]);
  return (
    <group onClick={pick}>
      <ambientLight intensity={0.8} />
      <directionalLight position={[50, 80, 40]} intensity={1.4} />
      <directionalLight position={[-60, 30, -50]} intensity={0.5} />
      {drawn.compartments.map((c) => (
        <group key={c.id}>
          <mesh geometry={c.solid} userData={{ pickId: c.id, kind: 'compartment' }}>
            <meshStandardMaterial color={c.id === selectedId ? '#f2b705' : '#9fb3c4'} transparent opacity={c.id === selectedId ? 0.3 : 0.12} depthWrite={false} side={THREE.DoubleSide} />
          </mesh>
          <lineSegments geometry={c.edges} raycast={() => null}>
            <lineBasicMaterial color={c.id === selectedId ? '#b0004f' : '#0b2239'} />
          </lineSegments>
          {c.layers.map((l) => (
            <mesh key={l.id} geometry={l.geometry} userData={{ pickId: c.id, kind: 'compartment' }}>
              <meshStandardMaterial color={l.colour} transparent opacity={0.6} side={THREE.DoubleSide} depthWrite={false} />
            </mesh>
          ))}
        </group>
      ))}
      {drawn.boundaries.map((b) => (
        <mesh key={b.id} geometry={b.geometry} userData={{ pickId: b.id, kind: 'boundary' }} renderOrder={2}>
          <meshStandardMaterial
            color={b.colour}
            side={THREE.DoubleSide}
            transparent
            opacity={0.85}
            emissive={b.id === selectedId ? '#f2b705' : '#000000'}
            emissiveIntensity={b.id === selectedId ? 0.6 : 0}
            polygonOffset
            polygonOffsetFactor={-1}
          />
        </mesh>
      ))}
      {drawn.arrows.map((a) => (
        <Arrow key={a.id} origin={a.origin} dir={a.dir} length={a.length} colour={a.id === selectedId ? '#f2b705' : '#0d1217'} />
      ))}
      <Shores shores={drawn.shores} />
      <mesh position={wl.point} quaternion={wlQuat} raycast={() => null} renderOrder={-1}>
        <planeGeometry args={[drawn.radius * 2.6, drawn.radius * 1.6]} />
        <meshBasicMaterial color="#1f6fa3" transparent opacity={0.12} side={THREE.DoubleSide} depthWrite={false} />
      </mesh>
    </group>
  );
}

function Legend({ maxPressurePa, system }: { maxPressurePa: number; system: UnitSystem }) {
  const stops = [-1, -0.5, 0, 0.5, 1];
  const gradient = `linear-gradient(to right, ${stops.map((t) => rgbCss(pressureRgb(t))).join(', ')})`;
  return (
    <div className="rounded-lg border border-line bg-card p-2 text-sm" data-testid="pressure-legend">
      <p className="font-bold">Mean net pressure on each plate</p>
      <div className="mt-1 h-4 rounded" style={{ background: gradient }} aria-hidden="true" />
      <div className="mt-0.5 flex justify-between tabular-nums">
        <span>{fmt(-maxPressurePa, 'pressure', system, 3)}</span>
        <span>0</span>
        <span>{fmt(maxPressurePa, 'pressure', system, 3)}</span>
      </div>
      <p className="text-xs text-ink-soft">Blue: pushed towards side A. Amber to magenta: pushed towards side B. Arrows: the resultant at the centre of pressure.</p>
    </div>
  );
}

export default function SurveyScene({ survey, results, system, selectedId, onSelect }: SurveySceneProps) {
  const drawn = useDrawn(survey, results);
  const [view, setView] = useState<View>('three-quarter');
  return (
    <div className="space-y-2">
      <div role="group" aria-label="View" className="flex flex-wrap gap-1">
        {VIEWS.map((v) => (
          <button
            key={v.id}
            type="button"
            aria-pressed={view === v.id}
            onClick={() => setView(v.id)}
            className={`min-h-touch rounded-lg border-2 border-hull px-3 font-bold ${view === v.id ? 'bg-hull text-paper' : 'bg-card text-hull'}`}
          >
            {v.label}
          </button>
        ))}
      </div>
      <div className="h-[60vh] min-h-72 overflow-hidden rounded-lg border-2 border-hull bg-[#e9eef2]" data-testid="model-canvas">
        <Canvas frameloop="demand" dpr={[1, 2]} gl={{ preserveDrawingBuffer: true, antialias: true }} camera={{ fov: 40, position: [0, 0, 100] }}>
          <Scene drawn={drawn} selectedId={selectedId} onSelect={onSelect} />
          <OrbitControls makeDefault enableDamping={false} />
          <CameraRig view={view} centre={drawn.centre} radius={drawn.radius} />
        </Canvas>
      </div>
      <Legend maxPressurePa={drawn.maxPressurePa} system={system} />
    </div>
  );
}
