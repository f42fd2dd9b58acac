/**
 * The demo casualty: MV Corran Tide, an invented general cargo ship, surveyed by the invented firm
 * Skerrow Marine Salvage after grounding. Used by the seed, the UI's demo and the CLI example
 * (seeds/demo-survey.json is generated from it by scripts/gen-schema.ts).
 */
import { SURVEY_SCHEMA_VERSION, type Boundary, type Point3, type Survey } from '@shared/schemas/survey';

/** Fixed ids so the demo is the same everywhere. */
const id = (n: number): string => `5eed0000-0000-4000-8000-${n.toString(16).padStart(12, '0')}`;

const P = (x: number, y: number, z: number): Point3 => ({ x, y, z });

const ID = {
  survey: id(1),
  vessel: id(2),
  condition: id(3),
  forePeak: id(10),
  tweenDeck1: id(11),
  lowerHold1: id(12),
  hold2: id(13),
  hold3: id(14),
  dbTank3: id(15),
  engineRoom: id(16),
  steering: id(17),
};

/** Orders a facet's vertices so its normal points along `towards`. */
function orient(vertices: Point3[], towards: Point3): Point3[] {
  let nx = 0, ny = 0, nz = 0;
  for (let i = 0; i < vertices.length; i++) {
    const a = vertices[i], b = vertices[(i + 1) % vertices.length];
    nx += (a.y - b.y) * (a.z + b.z);
    ny += (a.z - b.z) * (a.x + b.x);
    nz += (a.x - b.x) * (a.y + b.y);
  }
  return nx * towards.x + ny * towards.y + nz * towards.z >= 0 ? vertices : [...vertices].reverse();
}

function bilgeFacets(): { vertices: Point3[] }[] {
  // starboard bilge strake of No. 2 hold: a quarter circle of radius 1.6 m centred at y = −7.4, z = 2.8
  const facets: { vertices: Point3[] }[] = [];
  const n = 4;
  for (let i = 0; i < n; i++) {
    const a0 = Math.PI + (i * Math.PI) / 2 / n;
    const a1 = Math.PI + ((i + 1) * Math.PI) / 2 / n;
    const p0 = { y: -7.4 + 1.6 * Math.cos(a0), z: 2.8 + 1.6 * Math.sin(a0) };
    const p1 = { y: -7.4 + 1.6 * Math.cos(a1), z: 2.8 + 1.6 * Math.sin(a1) };
    const mid = { y: (p0.y + p1.y) / 2 + 7.4, z: (p0.z + p1.z) / 2 - 2.8 };
    facets.push({
      vertices: orient([P(62, p0.y, p0.z), P(88, p0.y, p0.z), P(88, p1.y, p1.z), P(62, p1.y, p1.z)], P(0, -mid.y, -mid.z)),
    });
  }
  return facets;
}

const hold = (compartmentId: string) => ({ kind: 'compartment' as const, compartmentId });

const timberShore = (n: number, y: number, z: number, lengthM: number, sideM: number): NonNullable<Boundary['shores']>[number] => ({
  id: id(n),
  position: P(62, y, z),
  lengthM,
  section: { kind: 'rectangular', widthM: sideM, depthM: sideM },
  elasticModulusPa: 11e9,
  allowableStressPa: 8e6,
  endCondition: 'pinned-pinned',
  side: 'B',
  // Douglas fir-larch No. 1 posts and timbers, wet: Fc 1,000 psi × CM 0.91 = 6.3 MPa,
  // Emin 580,000 psi × CM 0.9 = 3.6 GPa (NDS Supplement Table 4D and its wet-service factors)
  design: { method: 'nds-3.7.1', adjustedCompressionPa: 6.3e6, adjustedEMinPa: 3.6e9, c: 0.8 },
});

/**
 * The file of each demo photo (seeds/demo-photos/, an invented illustration of the scene its caption
 * names), put in the photo store by seeds/seed-photos.ts.
 */
export const DEMO_PHOTO_FILES: Record<string, string> = {
  [id(500)]: 'no-2-3-bulkhead-shoring.jpg',
  // the same photo in the survey sent for review: a photo id names one stored photo
  [id(501)]: 'no-2-3-bulkhead-shoring.jpg',
};

export function demoSurvey(): Survey {
  return {
    schemaVersion: SURVEY_SCHEMA_VERSION,
    id: ID.survey,
    vesselId: ID.vessel,
    title: 'MV Corran Tide — grounding, Sound of Skerrow',
    casualtyDescription:
      'Grounded on a falling tide; shell set in and holed at No. 1 starboard, No. 1 \'tween deck open to the sea, ' +
      'No. 2 hold making water through a cracked shell plate, engine room flooded from a failed sea chest with diesel ' +
      'floating on the flood water. Listing to starboard, trimmed by the stern. Surveyed for Skerrow Marine Salvage by ' +
      'Ines Achterberg (salvage surveyor), for review ashore by Tomas Varga (naval architect).',
    vessel: {
      name: 'MV Corran Tide',
      imo: '9000015',
      shipTimeOffsetMin: 60,
      lbpM: 118,
      breadthM: 18,
      depthM: 11,
      draughtMarks: { forwardXM: 118, aftXM: 0, midshipXM: 59 },
      // Lowest points of the openings nearest the water (deck at side 11 m, forecastle 13.6 m).
      downfloodingPoints: [
        { id: id(600), name: 'Fore peak air pipe, forecastle deck (stbd)', kind: 'air-pipe', position: P(111, -6.5, 14.3) },
        { id: id(601), name: 'No. 1 hatch coaming, fore end', kind: 'hatch-coaming', position: P(100, 0, 12.4) },
        { id: id(602), name: 'Engine room vent, casing top (stbd)', kind: 'vent', position: P(22, -6, 16.5) },
        { id: id(603), name: 'Accommodation door, main deck (stbd)', kind: 'door', position: P(14, -8.6, 11.3) },
      ],
    },
    conditions: [
      {
        id: ID.condition,
        name: 'Morning soundings, day 2',
        time: '2025-03-14T07:30:00Z',
        drafts: { forwardM: 6.2, aftM: 7.4, midPortM: 6.17, midStarboardM: 7.43 },
        heelDeg: 4,
        seaDensityKgM3: 1024,
        // The departure condition before the grounding, every modelled space empty: a part-laden
        // tween-decker (Δ ≈ 0.69·L·B·T·ρ) with her heavy cargo (steel) stowed low, so a stiff ship.
        // She is aground forward under No. 1 hold: the ground's reaction (the displacement she has
        // lost, about 1,340 t) holds her bow up against the water forward, which afloat would trim
        // her some 6 m by the head. tests/reference/grounding.test.ts checks the demo's figures.
        stability: {
          particulars: {
            kind: 'booklet',
            displacementT: { value: 7800, from: 'Corran Tide stability booklet p. 41, departure condition 3 (part cargo)' },
            meanDraftM: { value: 5.12, from: 'Corran Tide stability booklet p. 41, condition 3' },
            kgM: { value: 3.8, from: 'Corran Tide stability booklet p. 41, condition 3, KG corrected' },
            lcgM: { value: 55.5, from: 'Corran Tide stability booklet p. 41, condition 3' },
            tcgM: { value: -0.18, from: "Master's statement: about 2½° list to starboard on departure (cargo stowage)" },
            lcbM: { value: 59.3, from: 'Corran Tide stability booklet p. 12, hydrostatic table at 5.12 m' },
            tpcT: { value: 17.4, from: 'Corran Tide stability booklet p. 12, hydrostatic table at 5.12 m' },
            lcfM: { value: 58.2, from: 'Corran Tide stability booklet p. 12, hydrostatic table at 5.12 m' },
            mct1cmTM: { value: 125, from: 'Corran Tide stability booklet p. 12, hydrostatic table at 5.12 m' },
            kmM: { value: 7.75, from: 'Corran Tide stability booklet p. 12, hydrostatic table at 5.12 m' },
          },
          aground: { position: { x: 100, y: 0 }, from: "Diver's survey: bottom set in and bearing on rock under No. 1 hold, on the keel line" },
        },
        contents: [
          {
            compartmentId: ID.forePeak,
            layers: [{ id: id(100), fluidId: 'sea-water', level: { kind: 'ullage', reference: P(113, 0, 11), ullageM: 2.6 } }],
            gas: { kind: 'vented' },
          },
          {
            compartmentId: ID.tweenDeck1,
            layers: [{ id: id(101), fluidId: 'sea-water', level: { kind: 'openToSea' } }],
            gas: { kind: 'vented' },
          },
          {
            compartmentId: ID.lowerHold1,
            layers: [{ id: id(102), fluidId: 'sea-water', level: { kind: 'sounding', pipe: { x: 106.5, y: 7.5, bottomZM: 1.2 }, soundingM: 0.4 } }],
            gas: { kind: 'vented' },
          },
          {
            compartmentId: ID.hold2,
            layers: [{ id: id(103), fluidId: 'sea-water', level: { kind: 'sounding', pipe: { x: 86.5, y: 7.5, bottomZM: 1.2 }, soundingM: 3.6 } }],
            gas: { kind: 'vented' },
          },
          {
            compartmentId: ID.dbTank3,
            layers: [{ id: id(104), fluidId: 'hfo-bunkers', level: { kind: 'sounding', pipe: { x: 60.5, y: 8.2, bottomZM: 0 }, soundingM: 2.0 } }],
            gas: { kind: 'vented' },
          },
          {
            compartmentId: ID.engineRoom,
            layers: [
              { id: id(105), fluidId: 'sea-water', level: { kind: 'interfaceSounding', pipe: { x: 30, y: -3, bottomZM: 1.2 }, soundingM: 2.8 } },
              { id: id(106), fluidId: 'diesel', level: { kind: 'sounding', pipe: { x: 30, y: -3, bottomZM: 1.2 }, soundingM: 2.95 } },
            ],
            gas: { kind: 'vented' },
          },
        ],
      },
    ],
    activeConditionId: ID.condition,
    fluids: [
      { id: 'hfo-bunkers', name: 'HFO bunkers (from the delivery note)', category: 'oil', densityKgM3: 985, source: 'Bunker delivery note, density at 15 °C' },
    ],
    compartments: [
      { id: ID.forePeak, name: 'Fore peak tank', spaceType: 'tank', geometry: { kind: 'box', min: P(108, -6, 0), max: P(118, 6, 11) } },
      {
        id: ID.tweenDeck1,
        name: "No. 1 'tween deck",
        spaceType: 'dry-cargo',
        cargoState: 'part-loaded',
        geometry: { kind: 'box', min: P(88, -9, 5), max: P(108, 9, 11) },
        openToSea: true,
        breaches: [{ id: id(200), position: P(98, -9, 5.6), areaM2: 0.35 }],
      },
      { id: ID.lowerHold1, name: 'No. 1 lower hold', spaceType: 'dry-cargo', cargoState: 'loaded', geometry: { kind: 'box', min: P(88, -9, 1.2), max: P(108, 9, 5) } },
      {
        id: ID.hold2,
        name: 'No. 2 hold',
        spaceType: 'dry-cargo',
        cargoState: 'loaded',
        geometry: { kind: 'box', min: P(62, -9, 1.2), max: P(88, 9, 11) },
        breaches: [{ id: id(201), position: P(75, -9, 2.0), areaM2: 0.004, dischargeCoefficient: 0.6 }],
        pumps: [
          { id: id(210), name: 'Salvage pump P1 (150 m³/h)', capacityM3S: 150 / 3600 },
          { id: id(211), name: 'Salvage pump P2 (150 m³/h)', capacityM3S: 150 / 3600 },
        ],
        soundingLog: {
          pipe: { x: 86.5, y: 7.5, bottomZM: 1.2 },
          readings: [
            { time: '2025-03-14T04:30:00Z', soundingM: 2.95 },
            { time: '2025-03-14T05:30:00Z', soundingM: 3.17 },
            { time: '2025-03-14T06:30:00Z', soundingM: 3.4 },
            { time: '2025-03-14T07:30:00Z', soundingM: 3.6 },
          ],
        },
      },
      { id: ID.hold3, name: 'No. 3 hold', spaceType: 'dry-cargo', cargoState: 'empty', geometry: { kind: 'box', min: P(38, -9, 1.2), max: P(62, 9, 11) } },
      {
        id: ID.dbTank3,
        name: 'No. 3 double-bottom fuel tank (P)',
        spaceType: 'tank',
        // full of its own bunkers (pressed up into the sounding pipe): no room for flood water
        tankContents: { state: 'full', fluidId: 'hfo-bunkers' },
        geometry: { kind: 'box', min: P(38, 0, 0), max: P(62, 9, 1.2) },
      },
      {
        id: ID.engineRoom,
        name: 'Engine room',
        spaceType: 'machinery',
        geometry: {
          kind: 'prism',
          xAftM: 14,
          xForeM: 38,
          section: [
            { y: -9, z: 2.5 },
            { y: -7, z: 1.2 },
            { y: 7, z: 1.2 },
            { y: 9, z: 2.5 },
            { y: 9, z: 11 },
            { y: -9, z: 11 },
          ],
        },
      },
      { id: ID.steering, name: 'Steering gear flat', spaceType: 'stores', geometry: { kind: 'box', min: P(2, -8, 3), max: P(14, 8, 11) } },
    ],
    boundaries: [
      {
        id: id(300),
        name: "No. 1 'tween deck",
        kind: 'deck',
        geometry: { kind: 'rectangle', origin: P(88, -9, 5), edgeU: P(0, 18, 0), edgeV: P(20, 0, 0) },
        sideA: hold(ID.tweenDeck1),
        sideB: hold(ID.lowerHold1),
        ratedCapacity: { kind: 'pressure', pressurePa: 35e3 },
      },
      {
        id: id(301),
        name: "No. 1 'tween deck hatch cover",
        kind: 'hatch-cover',
        geometry: { kind: 'rectangle', origin: P(92, -5, 5), edgeU: P(0, 10, 0), edgeV: P(12, 0, 0) },
        sideA: hold(ID.tweenDeck1),
        sideB: hold(ID.lowerHold1),
        parentBoundaryId: id(300),
        // downwards (towards the lower hold) the covers' design load; upwards only their cleats hold them
        directionalCapacity: { kind: 'pressure', towardsB: 17.5e3, towardsA: 5e3 },
        notes: "Steel pontoon covers, design load 1.8 t/m² from the ship's plans; cleats good for about 5 kPa upwards (surveyor's estimate)",
      },
      {
        id: id(302),
        name: 'No. 2/3 hold bulkhead',
        kind: 'bulkhead',
        geometry: { kind: 'rectangle', origin: P(62, 9, 1.2), edgeU: P(0, -18, 0), edgeV: P(0, 0, 9.8) },
        sideA: hold(ID.hold2),
        sideB: hold(ID.hold3),
        stiffening: {
          direction: P(0, 0, 1),
          spacingM: 0.75,
          endFixity: 'simply-supported',
          sectionModulusM3: 450e-6,
          allowableStressPa: 160e6,
        },
        // 12.5 mm plating as built, 1.5 mm wastage allowed; mild steel, allowable 0.8 × 235 MPa
        plating: { thicknessM: 0.0125, corrosionAllowanceM: 0.0015, yieldStressPa: 235e6, allowableStressPa: 188e6, edges: 'fixed' },
        shores: [
          timberShore(400, 4.5, 2.6, 6.0, 0.25),
          timberShore(401, 0, 2.6, 6.0, 0.25),
          timberShore(402, -4.5, 2.6, 6.0, 0.25),
          timberShore(403, 0, 5.2, 7.2, 0.2),
        ],
        ratedCapacity: { kind: 'pressure', pressurePa: 110e3 },
      },
      {
        id: id(303),
        name: 'Engine room aft bulkhead',
        kind: 'bulkhead',
        geometry: { kind: 'rectangle', origin: P(14, 9, 1.2), edgeU: P(0, -18, 0), edgeV: P(0, 0, 9.8) },
        sideA: hold(ID.engineRoom),
        sideB: hold(ID.steering),
        stiffening: {
          direction: P(0, 0, 1),
          spacingM: 0.7,
          endFixity: 'fixed',
          sectionModulusM3: 250e-6,
          allowableStressPa: 160e6,
        },
      },
      {
        id: id(304),
        name: 'Engine room aft watertight door',
        kind: 'door',
        geometry: { kind: 'rectangle', origin: P(14, 0.4, 2.5), edgeU: P(0, -0.8, 0), edgeV: P(0, 0, 1.8) },
        sideA: hold(ID.engineRoom),
        sideB: hold(ID.steering),
        parentBoundaryId: id(303),
        ratedCapacity: { kind: 'pressure', pressurePa: 12e3 },
        notes: 'Hinged door, two dogs seized; rating reduced by the surveyor',
      },
      {
        id: id(305),
        name: 'No. 3 DB tank top',
        kind: 'tank-top',
        geometry: { kind: 'rectangle', origin: P(38, 0, 1.2), edgeU: P(24, 0, 0), edgeV: P(0, 9, 0) },
        sideA: hold(ID.dbTank3),
        sideB: hold(ID.hold3),
      },
      {
        id: id(306),
        name: 'No. 3 DB tank manhole cover',
        kind: 'manhole',
        geometry: { kind: 'circle', centre: P(50, 4.5, 1.2), normal: P(0, 0, 1), radiusM: 0.3 },
        sideA: hold(ID.dbTank3),
        sideB: hold(ID.hold3),
        parentBoundaryId: id(305),
        ratedCapacity: { kind: 'force', forceN: 25e3 },
      },
      {
        id: id(307),
        name: 'No. 2 hold shell patch (starboard)',
        kind: 'patch',
        geometry: { kind: 'rectangle', origin: P(74, -9, 1.5), edgeU: P(0, 0, 1), edgeV: P(2, 0, 0) },
        sideA: { kind: 'sea' },
        sideB: hold(ID.hold2),
        ratedCapacity: { kind: 'pressure', pressurePa: 80e3 },
        notes: 'Cement box over the cracked plate, 12 mm doubler bolted through',
      },
      {
        id: id(308),
        name: 'No. 2 hold starboard bilge',
        kind: 'shell',
        geometry: { kind: 'faceted', facets: bilgeFacets() },
        sideA: { kind: 'sea' },
        sideB: hold(ID.hold2),
      },
    ],
    photos: [
      {
        id: id(500),
        entity: { kind: 'boundary', id: id(302) },
        caption: 'Shoring on the No. 3 side of the No. 2/3 bulkhead',
        contentType: 'image/jpeg',
      },
    ],
  };
}

/**
 * A second invented casualty, already sent for review by the demo surveyor, so the engineer's queue
 * is not empty on first sign-in. The same model as the first under another ship's name and id.
 */
export const DEMO_SUBMITTED_SURVEY_ID = '3c9e1a20-7b4d-4e61-9f0a-5d2c8b7e4a11';

export function demoSubmittedSurvey(): Survey {
  const base = demoSurvey();
  return {
    ...base,
    id: DEMO_SUBMITTED_SURVEY_ID,
    vesselId: undefined,
    title: 'MV Lunga Sound: collision damage, Firth of Skerrow',
    casualtyDescription:
      'Struck on the starboard side forward in fog; No. 1 \'tween deck open to the sea and No. 2 hold making water. ' +
      'Surveyed for Skerrow Marine Salvage by Ines Achterberg (salvage surveyor), for review ashore by Tomas Varga (naval architect).',
    // 9×7 + 1×6 + 2×5 + 3×4 + 4×3 + 5×2 = 113: check digit 3
    vessel: { ...base.vessel, name: 'MV Lunga Sound', imo: '9123453' },
    photos: (base.photos ?? []).map((p) => ({ ...p, id: id(501) })),
  };
}

/**
 * The demo with its readings moved in time so that the latest was taken about an hour before `now`
 * (on a quarter hour): the invented casualty reads as happening when the demo is seeded, not as
 * readings hundreds of days old. Only the times move; every interval between readings stays, so
 * every figure computed from the survey is the same.
 */
export function demoAsOf(doc: Survey, now: Date): Survey {
  const times = [...doc.conditions.map((c) => c.time), ...doc.compartments.flatMap((c) => c.soundingLog?.readings.map((r) => r.time) ?? [])].map(Date.parse);
  const QUARTER = 15 * 60_000;
  const target = Math.floor((now.getTime() - 60 * 60_000) / QUARTER) * QUARTER;
  const shiftMs = target - Math.max(...times);
  const moved = (iso: string) => new Date(Date.parse(iso) + shiftMs).toISOString();
  return {
    ...doc,
    conditions: doc.conditions.map((c) => ({ ...c, time: moved(c.time) })),
    compartments: doc.compartments.map((c) => (c.soundingLog ? { ...c, soundingLog: { ...c.soundingLog, readings: c.soundingLog.readings.map((r) => ({ ...r, time: moved(r.time) })) } } : c)),
  };
}
