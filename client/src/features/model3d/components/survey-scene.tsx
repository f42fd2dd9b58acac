/**
 * The survey in 3D: compartments as translucent solids, each liquid layer cut at its level plane for
 * the ship's heel and trim, plates coloured by the size of their mean net pressure, the resultant
 * drawn as an arrow at the centre of pressure, shores as instanced struts, the outside waterline as a
 * plane, and a scale along the keel. It opens with the whole ship in view ("Fit to view" frames it
 * again); a tap names the space or plate under the finger. A thin view: every number and shape comes
 * from the engine (shared/engine, mesh.ts); this file only draws them. Lazy default export, its own chunk.
 *
 * The words in the model (the keel scale's marks, the tapped item's label) are ordinary elements of
 * this page laid over the canvas, moved to their points by the scene on every frame it draws
 * (PinProjector). drei's Html put each one in a React root of its own inside the canvas's element,
 * and taking the model off the page (another tab of the desk) then failed in React's removeChild.
 */
import { useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import { Canvas, useFrame, useThree, type ThreeEvent } from '@react-three/fiber';
import { OrbitControls } from '@react-three/drei';
import * as THREE from 'three';
import type { BoundarySummary, SurveyLevelResults } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { boundaryPolygons, compartmentSolid, liquidBody, type V3 } from '@shared/engine';
import { DISPLAY_UNITS, UNITS, fromSi } from '@shared/units/units';
import { fmt, percent } from '@client/lib/unit-system';
import { LIQUID_COLOUR, pressureRgb, rgbCss } from './pressure-colour';
import { frameBox, hullBox, scaleStep, toThree, viewDirection, type View } from './framing';

export interface SurveySceneProps {
  survey: Survey;
  results: SurveyLevelResults;
  /** Boundary summary rows (computeSurveySummary): colours and arrows. */
  rows: readonly BoundarySummary[];
  system: UnitSystem;
  selectedId: string | null;
  /** A tap on a space or plate: selects it here (the view stays). */
  onSelect: (id: string) => void;
  /** The tapped item's label offers this (the workspace opens its form); none on a read-only view. */
  onOpen?: (id: string) => void;
}

const VIEWS: { id: View; label: string }[] = [
  { id: 'oblique', label: 'Oblique' },
  { id: 'profile', label: 'Profile' },
  { id: 'plan', label: 'Plan' },
  { id: 'section', label: 'Section' },
];

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

interface Drawn {
  compartments: { id: string; solid: THREE.BufferGeometry; edges: THREE.EdgesGeometry; layers: { id: string; geometry: THREE.BufferGeometry; colour: string }[] }[];
  boundaries: { id: string; geometry: THREE.BufferGeometry; colour: THREE.Color; pressurePa: number }[];
  arrows: { id: string; origin: THREE.Vector3; dir: THREE.Vector3; length: number }[];
  shores: { from: THREE.Vector3; to: THREE.Vector3; radius: number }[];
  maxPressurePa: number;
  /** The whole ship: the hull's box grown to take in every modelled space. */
  box: THREE.Box3;
  radius: number;
  waterline: { point: THREE.Vector3; normal: THREE.Vector3 };
}

/**
 * What the scene draws. Geometry is built once per survey shape (the compartments' and plates'
 * arrays, which an edit of contents or readings leaves as they are) and kept across edits; the
 * liquids follow the results, and the plates' colours and arrows follow the summary rows, applied
 * to the kept meshes' materials in place.
 */
function useDrawn(survey: Survey, results: SurveyLevelResults, rows: readonly BoundarySummary[]): Drawn {
  const { compartments: comps, boundaries: plates, vessel } = survey;
  const solids = useMemo(() => {
    const list = comps.map((c) => {
      const solid = polygonsGeometry(compartmentSolid(c.geometry));
      return { id: c.id, solid, edges: new THREE.EdgesGeometry(solid, 20) };
    });
    // frame the whole ship, and any space modelled beyond the main dimensions
    const box = hullBox(vessel);
    for (const c of list) {
      c.solid.computeBoundingBox();
      if (c.solid.boundingBox) box.union(c.solid.boundingBox);
    }
    const radius = Math.max(box.getSize(new THREE.Vector3()).length() / 2, 1);
    return { list, box, radius };
  }, [comps, vessel]);
  const plateGeometry = useMemo(() => new Map(plates.map((b) => [b.id, polygonsGeometry(boundaryPolygons(b.geometry))])), [plates]);
  const liquids = useMemo(() => {
    const up: V3 = [results.frame.up.x, results.frame.up.y, results.frame.up.z];
    const byId = new Map(comps.map((c) => [c.id, c]));
    return new Map(
      results.compartments.map((cr) => {
        const c = byId.get(cr.id);
        let below = -Infinity;
        const layers = c
          ? cr.layers.map((l) => {
              const top = l.levelElevationM;
              const geometry = polygonsGeometry(top > below ? liquidBody(c.geometry, up, below, top) : []);
              below = Math.max(below, top);
              return { id: l.layerId, geometry, colour: LIQUID_COLOUR[l.category] };
            })
          : [];
        return [cr.id, layers] as const;
      }),
    );
  }, [comps, results]);
  useEffect(() => () => solids.list.forEach((c) => (c.solid.dispose(), c.edges.dispose())), [solids]);
  useEffect(() => () => plateGeometry.forEach((g) => g.dispose()), [plateGeometry]);
  useEffect(() => () => liquids.forEach((ls) => ls.forEach((l) => l.geometry.dispose())), [liquids]);
  return useMemo<Drawn>(() => {
    const { box, radius } = solids;
    const mean = (b: BoundarySummary) => (b.areaM2 > 0 && b.geometryKind !== 'faceted' ? b.forceN / b.areaM2 : 0);
    let maxPressurePa = 1, maxF = 1;
    for (const b of rows) {
      maxPressurePa = Math.max(maxPressurePa, Math.abs(mean(b)));
      maxF = Math.max(maxF, b.resultantN);
    }
    const boundaries = rows.flatMap((br) => {
      const geometry = plateGeometry.get(br.id);
      if (!geometry) return [];
      const p = mean(br);
      return [{ id: br.id, geometry, colour: new THREE.Color().setRGB(...pressureRgb(Math.abs(p) / maxPressurePa), THREE.SRGBColorSpace), pressurePa: p }];
    });
    const L = radius * 2;
    const arrows = rows.flatMap((br) => {
      if (br.copX === null || br.copY === null || br.copZ === null || br.resultantN <= 0) return [];
      const dir = toThree({ x: br.forceX, y: br.forceY, z: br.forceZ }).normalize();
      return [{ id: br.id, origin: toThree({ x: br.copX, y: br.copY, z: br.copZ }), dir, length: L * (0.03 + 0.09 * (br.resultantN / maxF)) }];
    });
    const byRow = new Map(rows.map((r) => [r.id, r]));
    const shores = plates.flatMap((b) => {
      const br = byRow.get(b.id);
      if (!br || br.normalX === null || br.normalY === null || br.normalZ === null || !b.shores) return [];
      const n = toThree({ x: br.normalX, y: br.normalY, z: br.normalZ }).normalize();
      return b.shores.map((s) => {
        const from = toThree(s.position);
        const dir = s.side === 'B' ? n : n.clone().negate();
        const radius = s.section.kind === 'rectangular' ? Math.max(s.section.widthM, s.section.depthM) / 2 : s.section.kind === 'tube' ? s.section.outerDiameterM / 2 : s.section.leastDimensionM / 2;
        return { from, to: from.clone().addScaledVector(dir, s.lengthM), radius };
      });
    });
    return {
      compartments: solids.list.map((c) => ({ ...c, layers: liquids.get(c.id) ?? [] })),
      boundaries,
      arrows,
      shores,
      maxPressurePa,
      box,
      radius,
      waterline: { point: toThree(results.frame.waterlinePoint), normal: toThree(results.frame.up).normalize() },
    };
  }, [solids, plateGeometry, liquids, rows, plates, results]);
}

/** Puts the camera where the whole ship is in view: on open, on a change of view, on "Fit to view". */
function CameraRig({ view, box, fitKey }: { view: View; box: THREE.Box3; fitKey: number }) {
  const camera = useThree((s) => s.camera) as THREE.PerspectiveCamera;
  const controls = useThree((s) => s.controls) as unknown as { target: THREE.Vector3; update: () => void } | null;
  const invalidate = useThree((s) => s.invalidate);
  const width = useThree((s) => s.size.width);
  const height = useThree((s) => s.size.height);
  useLayoutEffect(() => {
    if (width === 0 || height === 0) return;
    const f = frameBox(box, viewDirection(view), camera.fov, width / height);
    camera.position.copy(f.position);
    camera.near = f.near;
    camera.far = f.far;
    camera.updateProjectionMatrix();
    if (controls) {
      controls.target.copy(f.target);
      controls.update();
    } else camera.lookAt(f.target);
    invalidate();
  }, [view, box, fitKey, width, height, camera, controls, invalidate]);
  return null;
}

/** Marks the canvas once a frame has been drawn, so a test (or a person) knows the picture is there. */
function DrawnFlag({ onDrawn }: { onDrawn: () => void }) {
  const done = useRef(false);
  useFrame(() => {
    if (done.current) return;
    done.current = true;
    onDrawn();
  });
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

/** What a tap landed on, and where, for its label. */
interface Tapped {
  id: string;
  kind: 'compartment' | 'boundary';
  point: THREE.Vector3;
}

function Scene({ drawn, highlightId, onTap }: { drawn: Drawn; highlightId: string | null; onTap: (t: Tapped) => void }) {
  const pick = (e: ThreeEvent<MouseEvent>) => {
    e.stopPropagation();
    // Plates sit on compartment faces: prefer a plate within a hair of the nearest hit.
    const hits = e.intersections.filter((h) => typeof h.object.userData.pickId === 'string');
    if (hits.length === 0) return;
    const nearest = hits[0].distance;
    const hit = hits.find((h) => h.object.userData.kind === 'boundary' && h.distance - nearest < drawn.radius * 0.01) ?? hits[0];
    onTap({ id: String(hit.object.userData.pickId), kind: hit.object.userData.kind === 'boundary' ? 'boundary' : 'compartment', point: hit.point.clone() });
  };
  return (
    <group onClick={pick}>
      <ambientLight intensity={0.8} />
      <directionalLight position={[50, 80, 40]} intensity={1.4} />
      <directionalLight position={[-60, 30, -50]} intensity={0.5} />
      {drawn.compartments.map((c) => (
        <group key={c.id}>
          <mesh geometry={c.solid} userData={{ pickId: c.id, kind: 'compartment' }}>
            <meshStandardMaterial color={c.id === highlightId ? '#f2b705' : '#9fb3c4'} transparent opacity={c.id === highlightId ? 0.3 : 0.12} depthWrite={false} side={THREE.DoubleSide} />
          </mesh>
          <lineSegments geometry={c.edges} raycast={() => null}>
            <lineBasicMaterial color={c.id === highlightId ? '#b0004f' : '#0b2239'} />
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
            opacity={0.9}
            emissive={b.id === highlightId ? '#f2b705' : '#000000'}
            emissiveIntensity={b.id === highlightId ? 0.6 : 0}
            polygonOffset
            polygonOffsetFactor={-1}
          />
        </mesh>
      ))}
      {drawn.arrows.map((a) => (
        <Arrow key={a.id} origin={a.origin} dir={a.dir} length={a.length} colour={a.id === highlightId ? '#f2b705' : '#0d1217'} />
      ))}
      <Shores shores={drawn.shores} />
      <Waterline drawn={drawn} />
    </group>
  );
}

/**
 * The outside waterline: a plane through the waterline the readings give (heel and trim included),
 * reaching well past the hull so the freeboard all round can be read against it, with its edge drawn.
 */
function Waterline({ drawn }: { drawn: Drawn }) {
  const { box, waterline } = drawn;
  const plane = useMemo(() => {
    const n = waterline.normal;
    const c = box.getCenter(new THREE.Vector3());
    // the point of the plane nearest the ship's centre
    const centre = c.clone().addScaledVector(n, waterline.point.clone().sub(c).dot(n));
    const size = box.getSize(new THREE.Vector3());
    const quaternion = new THREE.Quaternion().setFromUnitVectors(new THREE.Vector3(0, 0, 1), n);
    const w = size.x * 1.3, h = Math.max(size.z * 3, size.x * 0.35);
    const outline = new THREE.BufferGeometry().setFromPoints([
      new THREE.Vector3(-w / 2, -h / 2, 0),
      new THREE.Vector3(w / 2, -h / 2, 0),
      new THREE.Vector3(w / 2, h / 2, 0),
      new THREE.Vector3(-w / 2, h / 2, 0),
    ]);
    return { centre, quaternion, w, h, outline };
  }, [box, waterline]);
  useEffect(() => () => plane.outline.dispose(), [plane]);
  return (
    <group position={plane.centre} quaternion={plane.quaternion}>
      <mesh raycast={() => null} renderOrder={-1}>
        <planeGeometry args={[plane.w, plane.h]} />
        <meshBasicMaterial color={LIQUID_COLOUR.water} transparent opacity={0.16} side={THREE.DoubleSide} depthWrite={false} />
      </mesh>
      <lineLoop geometry={plane.outline} raycast={() => null}>
        <lineBasicMaterial color={LIQUID_COLOUR.water} />
      </lineLoop>
    </group>
  );
}

/** The keel scale's marks (ship axes, m) and their line, in round steps of the user's length unit from the aft perpendicular. */
function useKeelMarks(vessel: Survey['vessel'], system: UnitSystem) {
  const unit = DISPLAY_UNITS[system].length;
  const marks = useMemo(() => {
    const lengthInUnits = fromSi(vessel.lbpM, unit);
    const step = scaleStep(lengthInUnits);
    const perUnitM = vessel.lbpM / lengthInUnits;
    const y = -vessel.breadthM / 2 - Math.max(vessel.breadthM * 0.08, 0.5);
    const tick = Math.max(vessel.depthM * 0.08, 0.3);
    const list: { x: number; label: string | null; at: THREE.Vector3 }[] = [];
    for (let k = 0, v = 0; v <= lengthInUnits + 1e-9; k++, v = k * step) {
      const x = v * perUnitM;
      list.push({ x, label: k % 2 === 0 ? `${Number(v.toPrecision(6))} ${UNITS[unit].label}` : null, at: toThree({ x, y, z: tick * 2 }) });
    }
    const points: THREE.Vector3[] = [toThree({ x: 0, y, z: 0 }), toThree({ x: list[list.length - 1].x, y, z: 0 })];
    for (const m of list) points.push(toThree({ x: m.x, y, z: 0 }), toThree({ x: m.x, y, z: m.label ? tick * 2 : tick }));
    return { list, geometry: new THREE.BufferGeometry().setFromPoints(points) };
  }, [vessel, unit]);
  useEffect(() => () => marks.geometry.dispose(), [marks]);
  return marks;
}

/** A scale along the keel on the starboard side (its words are pinned over the canvas). */
function KeelScale({ geometry }: { geometry: THREE.BufferGeometry }) {
  return (
    <lineSegments geometry={geometry} raycast={() => null}>
      <lineBasicMaterial color="#0d1217" />
    </lineSegments>
  );
}

/** Page elements that follow points of the model: the element and the point (three.js axes) it sits at. */
type Pins = Map<string, { el: HTMLElement; at: THREE.Vector3 }>;

/**
 * Moves every pinned element to where its point is drawn, on each frame the scene draws (the camera
 * moved, the canvas was resized), and once more when the set of pins changes (`version`).
 */
function PinProjector({ pins, version }: { pins: { current: Pins }; version: string }) {
  const v = useMemo(() => new THREE.Vector3(), []);
  const invalidate = useThree((st) => st.invalidate);
  useEffect(() => invalidate(), [version, invalidate]);
  useFrame(({ camera, size }) => {
    for (const { el, at } of pins.current.values()) {
      v.copy(at).project(camera);
      const behind = v.z > 1 || v.z < -1;
      el.style.visibility = behind ? 'hidden' : '';
      el.style.transform = `translate3d(${(((v.x + 1) / 2) * size.width).toFixed(1)}px, ${(((1 - v.y) / 2) * size.height).toFixed(1)}px, 0)`;
    }
  });
  return null;
}

/** A ref callback that pins an element to a point while it is on the page. */
function pinTo(pins: { current: Pins }, key: string, at: THREE.Vector3) {
  return (el: HTMLElement | null) => {
    if (el) pins.current.set(key, { el, at });
    else pins.current.delete(key);
  };
}

/** The name of what was tapped, with a figure or two, beside it in the model. */
function TapLabel({ tapped, survey, results, rows, system, onOpen, onClose }: { tapped: Tapped; survey: Survey; results: SurveyLevelResults; rows: readonly BoundarySummary[]; system: UnitSystem; onOpen?: (id: string) => void; onClose: () => void }) {
  let name = '', detail = '';
  if (tapped.kind === 'compartment') {
    const c = results.compartments.find((x) => x.id === tapped.id);
    name = c?.name ?? survey.compartments.find((x) => x.id === tapped.id)?.name ?? '';
    detail = c ? `${percent(c.fillFraction)} full · ${fmt(c.liquid.massKg, 'mass', system, 4)} of liquid` : '';
  } else {
    const b = rows.find((x) => x.id === tapped.id);
    name = b?.name ?? survey.boundaries.find((x) => x.id === tapped.id)?.name ?? '';
    const mean = b && b.areaM2 > 0 && b.geometryKind !== 'faceted' ? Math.abs(b.forceN / b.areaM2) : null;
    detail = b ? [mean !== null ? `mean net pressure ${fmt(mean, 'pressure', system, 3)}` : null, b.maxUtilisation !== null ? `utilisation ${percent(b.maxUtilisation)}` : null].filter(Boolean).join(' · ') : '';
  }
  return (
    <div className="pointer-events-auto w-56 -translate-x-1/2 translate-y-2 rounded-lg border-2 border-hull bg-card p-2 text-sm text-ink shadow-lg" data-testid="model-label" role="group" aria-label={name}>
        <div className="flex items-start justify-between gap-2">
          <p className="font-bold">{name}</p>
          <button type="button" onClick={onClose} aria-label="Close the label" className="-m-1 min-h-touch min-w-touch rounded font-bold text-hull">
            ×
          </button>
        </div>
        {detail && <p className="text-ink-soft">{detail}</p>}
        {onOpen && (
          <button type="button" onClick={() => onOpen(tapped.id)} className="mt-1 min-h-touch font-bold text-sea underline">
            Open its form
          </button>
        )}
    </div>
  );
}

function Legend({ maxPressurePa, system }: { maxPressurePa: number; system: UnitSystem }) {
  const stops = [0, 0.25, 0.5, 0.75, 1];
  const gradient = `linear-gradient(to right, ${stops.map((t) => rgbCss(pressureRgb(t))).join(', ')})`;
  const liquids: [keyof typeof LIQUID_COLOUR, string][] = [
    ['water', 'Water'],
    ['oil', 'Oil'],
    ['other', 'Other liquid'],
  ];
  return (
    <div className="grid gap-3 rounded-lg border border-line bg-card p-2 text-sm sm:grid-cols-[auto_minmax(0,1fr)]" data-testid="pressure-legend">
      <div>
        <p className="font-bold">Liquids</p>
        <ul className="mt-1 flex flex-wrap gap-x-3 gap-y-1">
          {liquids.map(([k, label]) => (
            <li key={k} className="flex items-center gap-1">
              <span aria-hidden="true" className="inline-block size-4 rounded-sm border border-line" style={{ background: LIQUID_COLOUR[k] }} />
              {label}
            </li>
          ))}
        </ul>
      </div>
      <div>
        <p className="font-bold">Mean net pressure on each plate</p>
        <div className="mt-1 h-4 rounded" style={{ background: gradient }} aria-hidden="true" />
        <div className="mt-0.5 flex justify-between tabular-nums">
          <span>0</span>
          <span>{fmt(maxPressurePa / 2, 'pressure', system, 3)}</span>
          <span>{fmt(maxPressurePa, 'pressure', system, 3)}</span>
        </div>
        <p className="text-xs text-ink-soft">Colour: how hard, either way. Arrows: which way the resultant pushes, at the centre of pressure. The blue plane is the outside waterline.</p>
      </div>
    </div>
  );
}

export default function SurveyScene({ survey, results, rows, system, selectedId, onSelect, onOpen }: SurveySceneProps) {
  const drawn = useDrawn(survey, results, rows);
  const [view, setView] = useState<View>('oblique');
  const [fitKey, setFitKey] = useState(0);
  const [tapped, setTapped] = useState<Tapped | null>(null);
  const [isDrawn, setIsDrawn] = useState(false);
  const marks = useKeelMarks(survey.vessel, system);
  const pins = useRef<Pins>(new Map());
  const pinVersion = `${marks.list.length}:${system}:${tapped ? `${tapped.id}@${tapped.point.toArray().join(',')}` : ''}`;
  const tap = (t: Tapped) => {
    setTapped(t);
    onSelect(t.id);
  };
  const button = (pressed: boolean) => `min-h-touch rounded-lg border-2 border-hull px-3 font-bold ${pressed ? 'bg-hull text-paper' : 'bg-card text-hull'}`;
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-1">
        <div role="group" aria-label="View" className="flex flex-wrap gap-1">
          {VIEWS.map((v) => (
            <button key={v.id} type="button" aria-pressed={view === v.id} onClick={() => (setView(v.id), setFitKey((k) => k + 1))} className={button(view === v.id)}>
              {v.label}
            </button>
          ))}
        </div>
        <button type="button" onClick={() => setFitKey((k) => k + 1)} className={button(false)}>
          Fit to view
        </button>
      </div>
      <div className="relative h-[60vh] min-h-72 overflow-hidden rounded-lg border-2 border-hull bg-[#e9eef2]" data-testid="model-canvas" data-drawn={isDrawn ? 'true' : 'false'}>
        <Canvas
          frameloop="demand"
          dpr={[1, 2]}
          gl={{ preserveDrawingBuffer: true, antialias: true }}
          camera={{ fov: 40, position: [0, 0, 100] }}
          onPointerMissed={() => setTapped(null)}
          // an image to assistive technology (a div may not carry a label without a role); the words
          // laid over it are page elements beside it
          role="img"
          aria-label={`3D model of ${survey.vessel.name}`}
        >
          <Scene drawn={drawn} highlightId={tapped?.id ?? selectedId} onTap={tap} />
          <KeelScale geometry={marks.geometry} />
          <OrbitControls makeDefault enableDamping={false} />
          <CameraRig view={view} box={drawn.box} fitKey={fitKey} />
          <DrawnFlag onDrawn={() => setIsDrawn(true)} />
          <PinProjector pins={pins} version={pinVersion} />
        </Canvas>
        <div className="pointer-events-none absolute inset-0 z-10">
          {marks.list.map((m) =>
            m.label ? (
              <div key={`mark-${m.x}`} ref={pinTo(pins, `mark-${m.x}`, m.at)} className="absolute top-0 left-0" style={{ visibility: 'hidden' }}>
                <span className="block -translate-x-1/2 -translate-y-1/2 whitespace-nowrap rounded bg-card px-1 text-xs font-bold text-ink" data-testid="scale-mark">
                  {m.label}
                </span>
              </div>
            ) : null,
          )}
          {tapped && (
            <div key={`tap-${tapped.id}`} ref={pinTo(pins, 'tap', tapped.point)} className="absolute top-0 left-0 z-20" style={{ visibility: 'hidden' }}>
              <TapLabel tapped={tapped} survey={survey} results={results} rows={rows} system={system} onOpen={onOpen} onClose={() => setTapped(null)} />
            </div>
          )}
        </div>
      </div>
      <Legend maxPressurePa={drawn.maxPressurePa} system={system} />
    </div>
  );
}
