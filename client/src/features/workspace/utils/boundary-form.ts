/** Boundary form values (what the surveyor types, in their units) to and from the survey format. */
import type { FieldError, Resolver } from 'react-hook-form';
import { BoundarySchema, type Boundary, type BoundarySide, type Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { byKey, parseField, showField, unitResolver } from './form-units';
import { emptyPlaneShape, geometryToPlaneShape, planeShapeToGeometry, type PlaneKind, type ShapeKind } from './plane-geometry';
import { parseX } from './parse-x';
import type { FrameTable } from './frames';
import { settleMarks, type Marks } from '@shared/schemas/marks';

export interface ShoreForm {
  id: string;
  x: string;
  y: string;
  z: string;
  length: string;
  secKind: 'rectangular' | 'tube';
  w: string;
  d: string;
  e: string;
  allow: string;
  end: 'pinned-pinned' | 'fixed-fixed' | 'fixed-pinned' | 'fixed-free';
  side: 'A' | 'B';
  angle: string;
  /** Column design method ('' = none given: Euler ÷ 2 or the allowable stress, flagged). */
  method: '' | 'aisc-360-e3' | 'nds-3.7.1' | 'generic';
  fy: string;
  fc: string;
  emin: string;
  fail: string;
  factor: string;
}

export interface BoundaryForm {
  name: string;
  kind: Boundary['kind'];
  parent: string;
  sideA: string;
  sideB: string;
  custom: boolean;
  plane: PlaneKind;
  at: string;
  sideAIs: 'low' | 'high';
  shape: ShapeKind;
  a1: string;
  a2: string;
  b1: string;
  b2: string;
  ca: string;
  cb: string;
  r: string;
  points: string;
  stiff: boolean;
  stDir: 'vertical' | 'longitudinal' | 'transverse';
  stSpacing: string;
  stFirst: string;
  stSpan: string;
  stFix: 'simply-supported' | 'fixed';
  stModulus: string;
  stAllow: string;
  shores: ShoreForm[];
  capKind: 'none' | 'pressure' | 'force';
  capValue: string;
  /** A rating with a direction (towards side A and/or side B); '' in a value = no rating that way. */
  dirKind: 'none' | 'pressure' | 'force';
  dirTowardsA: string;
  dirTowardsB: string;
  /** The plating check between stiffeners. */
  plating: boolean;
  plThick: string;
  plCorrosion: string;
  plYield: string;
  plAllow: string;
  plEdges: 'simply-supported' | 'fixed';
  notes: string;
  /** Not an input: the marks on this plate's figures (shared/schemas/marks.ts). */
  marks: Marks;
}

export const sideValue = (s: BoundarySide): string => (s.kind === 'compartment' ? s.compartmentId : s.kind);
export const sideFrom = (v: string): BoundarySide => (v === 'sea' ? { kind: 'sea' } : v === 'air' ? { kind: 'air' } : { kind: 'compartment', compartmentId: v });

const DIRS = { vertical: { x: 0, y: 0, z: 1 }, longitudinal: { x: 1, y: 0, z: 0 }, transverse: { x: 0, y: 1, z: 0 } } as const;

function dirName(d: { x: number; y: number; z: number }): BoundaryForm['stDir'] {
  const ax = Math.abs(d.x), ay = Math.abs(d.y), az = Math.abs(d.z);
  return az >= ax && az >= ay ? 'vertical' : ax >= ay ? 'longitudinal' : 'transverse';
}

export function boundaryToForm(b: Boundary, system: UnitSystem): BoundaryForm {
  const S = (n: number | undefined) => showField(n, 'length', system);
  const ps = geometryToPlaneShape(b.geometry);
  const p = ps ?? emptyPlaneShape();
  const st = b.stiffening;
  const cap = b.ratedCapacity;
  const dir = b.directionalCapacity;
  const dirMeasure = dir?.kind === 'force' ? 'force' : 'pressure';
  const pl = b.plating;
  return {
    name: b.name,
    kind: b.kind,
    parent: b.parentBoundaryId ?? '',
    sideA: sideValue(b.sideA),
    sideB: sideValue(b.sideB),
    custom: ps === null,
    plane: p.plane,
    at: S(p.at),
    sideAIs: p.sideA,
    shape: p.shape,
    a1: S(p.a1),
    a2: S(p.a2),
    b1: S(p.b1),
    b2: S(p.b2),
    ca: S(p.ca),
    cb: S(p.cb),
    r: S(p.r),
    points: p.points.map((q) => `${S(q.a)}, ${S(q.b)}`).join('\n'),
    stiff: st !== undefined,
    stDir: st ? dirName(st.direction) : 'vertical',
    stSpacing: S(st?.spacingM ?? 0.7),
    stFirst: S(st?.firstOffsetM),
    stSpan: S(st?.spanM),
    stFix: st?.endFixity ?? 'simply-supported',
    stModulus: showField(st?.sectionModulusM3 ?? 300e-6, 'sectionModulus', system),
    stAllow: showField(st?.allowableStressPa ?? 235e6, 'stress', system),
    shores: (b.shores ?? []).map((s) => ({
      id: s.id,
      x: S(s.position.x),
      y: S(s.position.y),
      z: S(s.position.z),
      length: S(s.lengthM),
      secKind: s.section.kind === 'tube' ? 'tube' : 'rectangular',
      w: S(s.section.kind === 'rectangular' ? s.section.widthM : s.section.kind === 'tube' ? s.section.outerDiameterM : s.section.leastDimensionM),
      d: S(s.section.kind === 'rectangular' ? s.section.depthM : s.section.kind === 'tube' ? s.section.wallThicknessM : s.section.leastDimensionM),
      e: showField(s.elasticModulusPa, 'stress', system),
      allow: showField(s.allowableStressPa, 'stress', system),
      end: s.endCondition,
      side: s.side,
      angle: s.angleFromNormalDeg === undefined ? '' : String(s.angleFromNormalDeg),
      method: s.design?.method ?? '',
      fy: showField(s.design?.method === 'aisc-360-e3' ? s.design.yieldStressPa : 235e6, 'stress', system),
      fc: showField(s.design?.method === 'nds-3.7.1' ? s.design.adjustedCompressionPa : 6.3e6, 'stress', system),
      emin: showField(s.design?.method === 'nds-3.7.1' ? s.design.adjustedEMinPa : 3.6e9, 'stress', system),
      fail: showField(s.design?.method === 'generic' ? s.design.failureStressPa : s.allowableStressPa * 2, 'stress', system),
      factor: s.design?.method === 'generic' ? String(s.design.designFactor) : '2',
    })),
    capKind: cap?.kind ?? 'none',
    capValue: cap ? (cap.kind === 'pressure' ? showField(cap.pressurePa, 'pressure', system) : showField(cap.forceN, 'force', system)) : '',
    dirKind: dir?.kind ?? 'none',
    dirTowardsA: showField(dir?.towardsA, dirMeasure, system),
    dirTowardsB: showField(dir?.towardsB, dirMeasure, system),
    plating: pl !== undefined,
    // new plating starts from typical mild-steel figures (marked assumed when switched on)
    plThick: showField(pl?.thicknessM ?? 0.012, 'thickness', system),
    plCorrosion: showField(pl?.corrosionAllowanceM ?? 0, 'thickness', system),
    plYield: showField(pl?.yieldStressPa ?? 235e6, 'stress', system),
    plAllow: showField(pl?.allowableStressPa ?? 0.6 * 235e6, 'stress', system),
    plEdges: pl?.edges ?? 'simply-supported',
    notes: b.notes ?? '',
    marks: b.marks ?? {},
  };
}

function parsePoints(text: string, system: UnitSystem): { a: number; b: number }[] | null {
  const pts = text
    .split(/\n|;/)
    .map((l) => l.trim())
    .filter(Boolean)
    .map((l) => {
      const [a, b] = l.split(/[\s,]+/);
      return { a: parseField(a ?? '', 'length', system), b: parseField(b ?? '', 'length', system) };
    });
  if (pts.some((p) => p.a === undefined || p.b === undefined || !Number.isFinite(p.a) || !Number.isFinite(p.b))) return null;
  return pts as { a: number; b: number }[];
}

function shoreDesign(s: ShoreForm, stress: (t: string) => number | undefined): unknown {
  switch (s.method) {
    case 'aisc-360-e3':
      return { method: s.method, yieldStressPa: stress(s.fy) };
    case 'nds-3.7.1':
      return { method: s.method, adjustedCompressionPa: stress(s.fc), adjustedEMinPa: stress(s.emin), c: 0.8 };
    case 'generic':
      return { method: s.method, failureStressPa: stress(s.fail), designFactor: Number(s.factor.replace(',', '.')) };
    default:
      return undefined;
  }
}

export function formToBoundary(v: BoundaryForm, base: Boundary, system: UnitSystem, frames: FrameTable): unknown {
  const L = (t: string) => parseField(t, 'length', system);
  const n0 = (t: number | undefined): number => t ?? 0;
  let geometry: unknown = base.geometry;
  if (!v.custom) {
    const at = v.plane === 'transverse' ? parseX(v.at, system, frames) : L(v.at);
    const xa = (t: string) => (v.plane === 'transverse' ? L(t) : parseX(t, system, frames));
    geometry = planeShapeToGeometry({
      plane: v.plane,
      at: n0(at),
      sideA: v.sideAIs,
      shape: v.shape,
      a1: n0(xa(v.a1)),
      a2: n0(xa(v.a2)),
      b1: n0(L(v.b1)),
      b2: n0(L(v.b2)),
      ca: n0(xa(v.ca)),
      cb: n0(L(v.cb)),
      r: n0(L(v.r)),
      points: parsePoints(v.points, system) ?? [],
    });
  }
  const stress = (t: string) => parseField(t, 'stress', system);
  const next = {
    ...base,
    name: v.name,
    kind: v.kind,
    parentBoundaryId: v.parent === '' ? undefined : v.parent,
    sideA: sideFrom(v.sideA),
    sideB: sideFrom(v.sideB),
    geometry,
    stiffening: v.stiff
      ? {
          direction: DIRS[v.stDir],
          spacingM: L(v.stSpacing),
          firstOffsetM: L(v.stFirst),
          spanM: L(v.stSpan),
          endFixity: v.stFix,
          sectionModulusM3: parseField(v.stModulus, 'sectionModulus', system),
          allowableStressPa: stress(v.stAllow),
        }
      : undefined,
    shores: v.shores.length
      ? v.shores.map((s) => ({
          id: s.id,
          position: { x: parseX(s.x, system, frames), y: L(s.y), z: L(s.z) },
          lengthM: L(s.length),
          section: s.secKind === 'tube' ? { kind: 'tube', outerDiameterM: L(s.w), wallThicknessM: L(s.d) } : { kind: 'rectangular', widthM: L(s.w), depthM: L(s.d) },
          elasticModulusPa: stress(s.e),
          allowableStressPa: stress(s.allow),
          endCondition: s.end,
          side: s.side,
          angleFromNormalDeg: parseField(s.angle, 'ratio', system),
          design: shoreDesign(s, stress),
        }))
      : undefined,
    ratedCapacity:
      v.capKind === 'none'
        ? undefined
        : v.capKind === 'pressure'
          ? { kind: 'pressure', pressurePa: parseField(v.capValue, 'pressure', system) }
          : { kind: 'force', forceN: parseField(v.capValue, 'force', system) },
    directionalCapacity:
      v.dirKind === 'none'
        ? undefined
        : { kind: v.dirKind, towardsA: parseField(v.dirTowardsA, v.dirKind, system), towardsB: parseField(v.dirTowardsB, v.dirKind, system) },
    plating: v.plating
      ? {
          thicknessM: parseField(v.plThick, 'thickness', system),
          corrosionAllowanceM: parseField(v.plCorrosion, 'thickness', system),
          yieldStressPa: stress(v.plYield),
          allowableStressPa: stress(v.plAllow),
          edges: v.plEdges,
        }
      : undefined,
    notes: v.notes.trim() === '' ? undefined : v.notes,
  };
  return { ...next, marks: settleMarks(v.marks, base, next) };
}

const MEASURES = byKey({
  spacingM: 'length',
  firstOffsetM: 'length',
  spanM: 'length',
  lengthM: 'length',
  widthM: 'length',
  depthM: 'length',
  outerDiameterM: 'length',
  wallThicknessM: 'length',
  radiusM: 'length',
  sectionModulusM3: 'sectionModulus',
  allowableStressPa: 'stress',
  elasticModulusPa: 'stress',
  yieldStressPa: 'stress',
  adjustedCompressionPa: 'stress',
  adjustedEMinPa: 'stress',
  failureStressPa: 'stress',
  pressurePa: 'pressure',
  forceN: 'force',
  thicknessM: 'thickness',
  corrosionAllowanceM: 'thickness',
  x: 'length',
  y: 'length',
  z: 'length',
});

/** Errors of the shape fields, which the survey format cannot word (it sees only computed corners). */
function shapeErrors(v: BoundaryForm, system: UnitSystem, frames: FrameTable): Record<string, FieldError> {
  const out: Record<string, FieldError> = {};
  if (v.custom) return out;
  const bad = (name: string, message: string) => (out[name] = { type: 'validate', message });
  const num = (name: keyof BoundaryForm, x = false) => {
    const t = v[name] as string;
    const n = x ? parseX(t, system, frames) : parseField(t, 'length', system);
    if (n === undefined) bad(name, 'Required: enter a value.');
    else if (!Number.isFinite(n)) bad(name, x ? 'Enter a number or a frame such as Fr 45.' : 'Enter a number, for example 12.5.');
    return n;
  };
  const inPlaneX = v.plane !== 'transverse';
  num('at', v.plane === 'transverse');
  if (v.shape === 'rectangle') {
    const a1 = num('a1', inPlaneX), a2 = num('a2', inPlaneX), b1 = num('b1'), b2 = num('b2');
    if (a1 !== undefined && a2 !== undefined && Math.abs(a1 - a2) < 1e-6 && !out.a2) bad('a2', 'Must differ from the other edge.');
    if (b1 !== undefined && b2 !== undefined && Math.abs(b1 - b2) < 1e-6 && !out.b2) bad('b2', 'Must differ from the other edge.');
  } else if (v.shape === 'circle') {
    num('ca', inPlaneX);
    num('cb');
    const r = num('r');
    if (r !== undefined && Number.isFinite(r) && r <= 0) bad('r', 'Must be more than 0.');
  } else {
    const pts = parsePoints(v.points, system);
    if (!pts) bad('points', 'Each line needs two numbers, for example 2.5, 1.0');
    else if (pts.length < 3) bad('points', 'Needs at least 3 corners.');
  }
  return out;
}

export function boundaryResolver(base: Boundary, system: UnitSystem, frames: FrameTable): Resolver<BoundaryForm, unknown, Boundary> {
  const inner = unitResolver(BoundarySchema, (v: BoundaryForm) => formToBoundary(v, base, system, frames), system, MEASURES);
  return async (values, ctx, opts) => {
    const extra = shapeErrors(values, system, frames);
    const r = await inner(values, ctx, opts);
    if (Object.keys(extra).length === 0) return r;
    return { values: {}, errors: { ...r.errors, ...extra } } as Awaited<ReturnType<typeof inner>>;
  };
}

export function sideOptions(survey: Survey): { value: string; label: string }[] {
  return [...survey.compartments.map((c) => ({ value: c.id, label: c.name })), { value: 'sea', label: 'Sea' }, { value: 'air', label: 'Open air (dry, vented)' }];
}
