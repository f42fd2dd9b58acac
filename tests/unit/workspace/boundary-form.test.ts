// The plate form: what the surveyor types, in their units, to the survey format and back. Conversions are
// checked against mathjs's units (an outside library) and NIST SP 811 (2008) Appendix B (1 ft = 0.3048 m,
// 1 psi = 6 894.757 Pa, 1 in³ = 16.387 064 cm³); geometry by hand.
import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import type { Boundary } from '@shared/schemas/survey';
import { DEFAULT_FRAME_TABLE } from '@client/features/workspace/utils/frames';
import { boundaryResolver, boundaryToForm, formToBoundary, sideFrom, sideValue, type BoundaryForm } from '@client/features/workspace/utils/boundary-form';

const HOLD = '0b6f3f38-6f0e-4d43-9f77-1d3d0ab1f001';
const SHORE = '0b6f3f38-6f0e-4d43-9f77-1d3d0ab1f003';

/** A 4 m × 3 m transverse bulkhead at x = 20 m, stiffened, with one timber shore and a rated pressure. */
const plate: Boundary = {
  id: '0b6f3f38-6f0e-4d43-9f77-1d3d0ab1f002',
  name: 'Aft bulkhead of No. 2 hold',
  kind: 'bulkhead',
  geometry: { kind: 'rectangle', origin: { x: 20, y: -2, z: 0 }, edgeU: { x: 0, y: 4, z: 0 }, edgeV: { x: 0, y: 0, z: 3 } },
  sideA: { kind: 'compartment', compartmentId: HOLD },
  sideB: { kind: 'air' },
  stiffening: { direction: { x: 0, y: 0, z: 1 }, spacingM: 0.6, endFixity: 'fixed', sectionModulusM3: 250e-6, allowableStressPa: 235e6 },
  shores: [
    {
      id: SHORE,
      position: { x: 19, y: 0, z: 1.5 },
      lengthM: 3.048,
      section: { kind: 'rectangular', widthM: 0.1524, depthM: 0.1524 },
      elasticModulusPa: 11e9,
      allowableStressPa: 8e6,
      endCondition: 'pinned-pinned',
      side: 'B',
    },
  ],
  ratedCapacity: { kind: 'pressure', pressurePa: 100e3 },
};

/** Deep equality with numbers within `tol`. */
function expectNear(actual: unknown, expected: unknown, tol: number): void {
  if (typeof expected === 'number') return void expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(tol);
  if (expected && typeof expected === 'object') {
    expect(Object.keys(actual as object).sort()).toEqual(Object.keys(expected).sort());
    for (const [k, v] of Object.entries(expected)) expectNear((actual as Record<string, unknown>)[k], v, tol);
    return;
  }
  expect(actual).toEqual(expected);
}

const resolve = async (form: BoundaryForm, base: Boundary = plate) =>
  boundaryResolver(base, 'si', DEFAULT_FRAME_TABLE)(form, undefined, { shouldUseNativeValidation: false, fields: {} });

describe('boundaryToForm', () => {
  it('describes the rectangle on its transverse plane in metres', () => {
    const f = boundaryToForm(plate, 'si');
    expect(f).toMatchObject({ plane: 'transverse', at: '20', sideAIs: 'low', shape: 'rectangle', a1: '-2', a2: '2', b1: '0', b2: '3', custom: false });
    expect(f).toMatchObject({ sideA: HOLD, sideB: 'air', stiff: true, stDir: 'vertical', stSpacing: '0.6', stFix: 'fixed' });
  });

  it('shows US units as the user reads them: a 3.048 m shore is 10 ft, 0.1524 m is 0.5 ft, 100 kPa is 14.5038 psi (NIST SP 811)', () => {
    const f = boundaryToForm(plate, 'us');
    expect(f.shores[0]).toMatchObject({ length: '10', w: '0.5', d: '0.5', secKind: 'rectangular', side: 'B' });
    expect(Number(f.capValue)).toBeCloseTo(unit(100, 'kPa').toNumber('psi'), 6);
    expect(Number(f.capValue)).toBeCloseTo(14.5038, 4);
    // 250 cm³ = 15.256 in³ (1 in³ = 16.387064 cm³, NIST SP 811)
    expect(Number(f.stModulus)).toBeCloseTo(250 / 16.387064, 6);
    // 235 MPa = 34.084 ksi, by mathjs
    expect(Number(f.stAllow)).toBeCloseTo(unit(235, 'MPa').toNumber('psi') / 1000, 6);
  });
});

describe('formToBoundary', () => {
  it('gives back the plate it was read from, in either unit system', () => {
    for (const system of ['si', 'us'] as const) {
      const back = formToBoundary(boundaryToForm(plate, system), plate, system, DEFAULT_FRAME_TABLE) as Boundary;
      // feet are shown to 10 significant figures, so metres come back within 1e-8 m
      expectNear(back.geometry, plate.geometry, 1e-8);
      expect(back.sideA).toEqual(plate.sideA);
      expect(back.stiffening!.spacingM).toBeCloseTo(0.6, 9);
      expect(back.stiffening!.sectionModulusM3).toBeCloseTo(250e-6, 12);
      expect(back.stiffening!.allowableStressPa).toBeCloseTo(235e6, 1);
      expect(back.shores![0].lengthM).toBeCloseTo(3.048, 9);
      expect(back.ratedCapacity).toMatchObject({ kind: 'pressure' });
      expect((back.ratedCapacity as { pressurePa: number }).pressurePa).toBeCloseTo(100e3, 4);
    }
  });

  it('reads the plane position as a frame number: Fr 25 with 0.8 m frames is x = 20 m (25 × 0.8, by hand)', () => {
    const f = { ...boundaryToForm(plate, 'si'), at: 'Fr 25' };
    const back = formToBoundary(f, plate, 'si', DEFAULT_FRAME_TABLE) as Boundary;
    expect(back.geometry).toEqual(plate.geometry);
  });

  it('leaves out what the form turned off: no stiffeners, no shores, no rated capacity, no empty notes', () => {
    const f: BoundaryForm = { ...boundaryToForm(plate, 'si'), stiff: false, shores: [], capKind: 'none', notes: '   ' };
    const back = formToBoundary(f, plate, 'si', DEFAULT_FRAME_TABLE) as Boundary;
    expect(back.stiffening).toBeUndefined();
    expect(back.shores).toBeUndefined();
    expect(back.ratedCapacity).toBeUndefined();
    expect(back.notes).toBeUndefined();
  });

  it('keeps a geometry the plane form cannot describe (custom) as it was', () => {
    const tilted: Boundary = { ...plate, geometry: { kind: 'rectangle', origin: { x: 0, y: 0, z: 0 }, edgeU: { x: 1, y: 1, z: 0 }, edgeV: { x: 0, y: 0, z: 1 } } };
    const f = boundaryToForm(tilted, 'si');
    expect(f.custom).toBe(true);
    expect((formToBoundary(f, tilted, 'si', DEFAULT_FRAME_TABLE) as Boundary).geometry).toEqual(tilted.geometry);
  });
});

describe('boundaryResolver', () => {
  it('passes a valid form as the survey format’s boundary', async () => {
    const r = await resolve(boundaryToForm(plate, 'si'));
    expect(r.errors).toEqual({});
    expect((r.values as Boundary).geometry).toEqual(plate.geometry);
  });

  it('marks a rectangle whose edges coincide, and keeps what was typed', async () => {
    const f = { ...boundaryToForm(plate, 'si'), b2: '0' };
    const r = await resolve(f);
    expect((r.errors as Record<string, { message: string }>).b2.message).toBe('Must differ from the other edge.');
    expect(f.b2).toBe('0');
  });

  it('says a frame or a number is wanted for the plane position', async () => {
    const r = await resolve({ ...boundaryToForm(plate, 'si'), at: 'aft' });
    expect((r.errors as Record<string, { message: string }>).at.message).toBe('Enter a number or a frame such as Fr 45.');
  });

  it('asks for three corners of a polygon and two numbers a line', async () => {
    const base = { ...boundaryToForm(plate, 'si'), shape: 'polygon' as const };
    const two = await resolve({ ...base, points: '0, 0\n1, 0' });
    expect((two.errors as Record<string, { message: string }>).points.message).toBe('Needs at least 3 corners.');
    const junk = await resolve({ ...base, points: '0, 0\n1\n1, 1' });
    expect((junk.errors as Record<string, { message: string }>).points.message).toBe('Each line needs two numbers, for example 2.5, 1.0');
  });

  it('words a too-small circle and a missing stiffener spacing', async () => {
    const circle = await resolve({ ...boundaryToForm(plate, 'si'), shape: 'circle', ca: '0', cb: '1', r: '0' });
    expect((circle.errors as Record<string, { message: string }>).r.message).toBe('Must be more than 0.');
    const noSpacing = await resolve({ ...boundaryToForm(plate, 'si'), stSpacing: '' });
    expect(JSON.stringify(noSpacing.errors)).toContain('Required: enter a value.');
  });
});

describe('sides', () => {
  it('reads the side choices both ways', () => {
    expect(sideFrom('sea')).toEqual({ kind: 'sea' });
    expect(sideFrom('air')).toEqual({ kind: 'air' });
    expect(sideFrom(HOLD)).toEqual({ kind: 'compartment', compartmentId: HOLD });
    expect(sideValue({ kind: 'compartment', compartmentId: HOLD })).toBe(HOLD);
  });
});
