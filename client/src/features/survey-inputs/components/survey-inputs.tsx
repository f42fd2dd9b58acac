/**
 * The surveyor's inputs on the desk, read-only: readings, spaces with their contents and sounding pipes,
 * boundaries with their stiffeners and shores, and photos. Each item has an anchor, so a result or a
 * history line can open the inputs it rests on (`InputTarget`). Figures are worded as the history words
 * them (`figureWords`), with the surveyor's "assumed" / "estimated" marks beside them.
 */
import { useEffect, useRef, type ReactNode } from 'react';
import type { Boundary, Compartment, Condition, Layer, PhotoRef, Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { figureWords } from '@shared/review/change-words';
import { boundaryKindWords, END_CONDITION_WORDS, SPACE_TYPE_WORDS, countWords, openingWords } from '@shared/review/plain-words';
import { formatShipAndUtc, utcOffsetWords } from '@shared/review/time-words';
import { markOf, type Marks } from '@shared/schemas/marks';
import { catalogueFluid } from '@shared/fluids/catalogue';
import { pointWords } from '@shared/units/point-words';
import { ServerPhoto } from '@client/components/photos/server-photo';

export interface InputTarget {
  kind: 'compartment' | 'boundary' | 'condition';
  id: string;
}

export const inputAnchor = (t: InputTarget) => `input-${t.kind}-${t.id}`;

function Mark({ marks, field }: { marks: Marks | undefined; field: string }) {
  const m = markOf(marks, field);
  return m ? <span className="ml-1 rounded bg-caution-soft px-1 text-xs font-bold text-ink">{m}</span> : null;
}

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex flex-wrap justify-between gap-x-3 border-t border-line py-0.5 first:border-t-0">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="text-right tabular-nums">{children}</dd>
    </div>
  );
}

function Card(props: { target: InputTarget; title: string; focused: boolean; anchored: boolean; children: ReactNode }) {
  const ref = useRef<HTMLElement>(null);
  useEffect(() => {
    if (props.focused) {
      ref.current?.scrollIntoView?.({ block: 'start' });
      ref.current?.focus({ preventScroll: true });
    }
  }, [props.focused]);
  return (
    <section
      ref={ref}
      id={props.anchored ? inputAnchor(props.target) : undefined}
      tabIndex={-1}
      aria-label={props.title}
      className={`scroll-mt-24 rounded-lg border bg-card p-3 text-sm ${props.focused ? 'border-2 border-sea' : 'border-line'}`}
    >
      <h4 className="font-bold">{props.title}</h4>
      {props.children}
    </section>
  );
}

function Photos({ photos }: { photos: PhotoRef[] }) {
  if (photos.length === 0) return null;
  return (
    <ul className="mt-2 grid grid-cols-2 gap-2 sm:grid-cols-3">
      {photos.map((p) => (
        <li key={p.id} className="overflow-hidden rounded border border-line">
          <ServerPhoto id={p.id} alt={p.caption || 'Photo'} />
          <p className="p-1 text-xs">{p.caption || 'No caption'}</p>
        </li>
      ))}
    </ul>
  );
}

/** The fluid of a layer by its name (the survey's own fluids first, then the catalogue). */
function fluidName(doc: Survey, id: string): string {
  return doc.fluids.find((f) => f.id === id)?.name ?? catalogueFluid(id)?.name ?? id;
}

function LevelWords({ layer, system }: { layer: Layer; system: UnitSystem }) {
  const l = layer.level;
  const not = <span className="font-bold text-danger">not read yet</span>;
  switch (l.kind) {
    case 'sounding':
    case 'interfaceSounding':
      return (
        <>
          {l.kind === 'sounding' ? 'Sounding' : 'Interface sounding'} {l.soundingM === undefined ? not : figureWords(l.soundingM, 'soundingM', system)}
          <Mark marks={layer.marks} field="level" /> at the pipe {pointWords({ x: l.pipe.x, y: l.pipe.y, z: l.pipe.bottomZM }, system)} (pipe bottom)
        </>
      );
    case 'ullage':
      return (
        <>
          Ullage {l.ullageM === undefined ? not : figureWords(l.ullageM, 'ullageM', system)}
          <Mark marks={layer.marks} field="level" /> from {pointWords(l.reference, system)}
          {l.tape === 'plumb' ? ', tape hanging plumb' : ''}
        </>
      );
    case 'openToSea':
      return <>Level with the sea outside</>;
    case 'point':
      return <>Level through {pointWords(l.point, system)}</>;
  }
}

function ShipCard({ doc, system }: { doc: Survey; system: UnitSystem }) {
  const v = doc.vessel;
  return (
    <section aria-label="The ship" className="rounded-lg border border-line bg-card p-3 text-sm">
      <h4 className="font-bold">{v.name}</h4>
      <dl>
        <Row label="IMO number">{v.imo ?? 'not given'}</Row>
        <Row label="Length between perpendiculars">{figureWords(v.lbpM, 'lbpM', system)}</Row>
        <Row label="Breadth">{figureWords(v.breadthM, 'breadthM', system)}</Row>
        <Row label="Depth">{figureWords(v.depthM, 'depthM', system)}</Row>
        <Row label="Draught marks">
          forward {figureWords(v.draughtMarks.forwardXM, 'x', system)}, aft {figureWords(v.draughtMarks.aftXM, 'x', system)} from AP
        </Row>
        <Row label="Ship’s clock">{v.shipTimeOffsetMin === undefined ? 'not given (times in UTC)' : utcOffsetWords(v.shipTimeOffsetMin)}</Row>
      </dl>
      <p className="mt-2 whitespace-pre-line">{doc.casualtyDescription}</p>
    </section>
  );
}

function ReadingsCard({ doc, c, system, focused, anchored = true }: { doc: Survey; c: Condition; system: UnitSystem; focused: boolean; anchored?: boolean }) {
  const d = c.drafts;
  const draft = (v: number | undefined, field: string) => (v === undefined ? <span className="font-bold text-danger">not read yet</span> : <>{figureWords(v, 'forwardM', system)}<Mark marks={c.marks} field={field} /></>);
  return (
    <Card target={{ kind: 'condition', id: c.id }} title={`Readings: ${c.name ?? 'unnamed condition'}${c.id === doc.activeConditionId ? ' (in use)' : ''}`} focused={focused} anchored={anchored}>
      <dl>
        <Row label="Taken">{formatShipAndUtc(c.time, doc.vessel.shipTimeOffsetMin)}</Row>
        <Row label="Forward draft">{draft(d.forwardM, 'drafts.forwardM')}</Row>
        <Row label="Aft draft">{draft(d.aftM, 'drafts.aftM')}</Row>
        {d.midPortM !== undefined && <Row label="Midship draft, port">{draft(d.midPortM, 'drafts.midPortM')}</Row>}
        {d.midStarboardM !== undefined && <Row label="Midship draft, starboard">{draft(d.midStarboardM, 'drafts.midStarboardM')}</Row>}
        <Row label="Heel (inclinometer)">{c.heelDeg === undefined ? 'not read (from the midship drafts)' : <>{figureWords(Math.abs(c.heelDeg), 'heelDeg', system)} to {c.heelDeg >= 0 ? 'starboard' : 'port'}<Mark marks={c.marks} field="heelDeg" /></>}</Row>
        <Row label="Sea water density">{c.seaDensityKgM3 === undefined ? '1025 kg/m³ (standard)' : figureWords(c.seaDensityKgM3, 'seaDensityKgM3', system)}<Mark marks={c.marks} field="seaDensityKgM3" /></Row>
      </dl>
    </Card>
  );
}

function SpaceCard({ doc, s, condition, system, focused, anchored = true }: { doc: Survey; s: Compartment; condition: Condition | undefined; system: UnitSystem; focused: boolean; anchored?: boolean }) {
  const contents = condition?.contents.find((c) => c.compartmentId === s.id);
  const g = s.geometry;
  return (
    <Card target={{ kind: 'compartment', id: s.id }} title={s.name} focused={focused} anchored={anchored}>
      <dl>
        <Row label="Type">{SPACE_TYPE_WORDS[s.spaceType]}</Row>
        <Row label="Extent">
          {g.kind === 'box'
            ? `${figureWords(g.min.x, 'x', system)} to ${figureWords(g.max.x, 'x', system)} fwd of AP, ${figureWords(g.max.y - g.min.y, 'widthM', system)} wide, ${figureWords(g.min.z, 'z', system)} to ${figureWords(g.max.z, 'z', system)} above base`
            : `${figureWords(g.xAftM, 'x', system)} to ${figureWords(g.xForeM, 'x', system)} fwd of AP, a section of ${countWords(g.section.length, 'point')}`}
        </Row>
        <Row label="Permeability">
          {s.permeability === undefined ? 'by space type' : figureWords(s.permeability, 'permeability', system)}
          <Mark marks={s.marks} field="permeability" />
        </Row>
        {s.openToSea && <Row label="Open to the sea">yes</Row>}
        {(s.breaches ?? []).map((b, i) => (
          <Row key={b.id} label={`Breach ${i + 1}`}>
            {openingWords(b, system)} at {pointWords(b.position, system)}
          </Row>
        ))}
        {(s.pumps ?? []).map((p) => (
          <Row key={p.id} label={`Pump “${p.name}”`}>
            {figureWords(p.capacityM3S, 'capacityM3S', system)}
            {p.running === false ? ', stopped' : ''}
          </Row>
        ))}
      </dl>
      <h5 className="mt-2 font-bold">Contents{condition?.name ? ` (${condition.name})` : ''}</h5>
      {!contents || contents.layers.length === 0 ? (
        <p className="text-ink-soft">Empty (no liquid entered).</p>
      ) : (
        <ul className="list-disc pl-5">
          {contents.layers.map((l) => (
            <li key={l.id}>
              {fluidName(doc, l.fluidId)}
              {l.densityKgM3 !== undefined && <> at {figureWords(l.densityKgM3, 'densityKgM3', system)}<Mark marks={l.marks} field="densityKgM3" /></>}: <LevelWords layer={l} system={system} />
            </li>
          ))}
          {contents.gas?.kind === 'pressurised' && <li>Gas space held at {figureWords(contents.gas.gaugePressurePa, 'gaugePressurePa', system)} gauge</li>}
        </ul>
      )}
      <Photos photos={(doc.photos ?? []).filter((p) => p.entity.kind === 'compartment' && p.entity.id === s.id)} />
    </Card>
  );
}

function sideWords(doc: Survey, side: Boundary['sideA']): string {
  if (side.kind === 'sea') return 'the sea';
  if (side.kind === 'air') return 'open air';
  return doc.compartments.find((c) => c.id === side.compartmentId)?.name ?? 'a space since removed';
}

function BoundaryCard({ doc, b, system, focused, anchored = true }: { doc: Survey; b: Boundary; system: UnitSystem; focused: boolean; anchored?: boolean }) {
  const st = b.stiffening;
  return (
    <Card target={{ kind: 'boundary', id: b.id }} title={b.name} focused={focused} anchored={anchored}>
      <dl>
        <Row label="Kind">{boundaryKindWords(b.kind)}</Row>
        <Row label="Side A">{sideWords(doc, b.sideA)}</Row>
        <Row label="Side B">{sideWords(doc, b.sideB)}</Row>
        <Row label="Outline">
          {b.geometry.kind === 'rectangle'
            ? `rectangle ${figureWords(Math.hypot(b.geometry.edgeU.x, b.geometry.edgeU.y, b.geometry.edgeU.z), 'widthM', system)} × ${figureWords(Math.hypot(b.geometry.edgeV.x, b.geometry.edgeV.y, b.geometry.edgeV.z), 'heightM', system)}, one corner at ${pointWords(b.geometry.origin, system)}`
            : b.geometry.kind === 'circle'
              ? `circle of radius ${figureWords(b.geometry.radiusM, 'radiusM', system)} at ${pointWords(b.geometry.centre, system)}`
              : b.geometry.kind === 'polygon'
                ? `polygon of ${countWords(b.geometry.vertices.length, 'corner')}`
                : `curved, ${countWords(b.geometry.facets.length, 'facet')}`}
        </Row>
        {st && (
          <>
            <Row label="Stiffener spacing">{figureWords(st.spacingM, 'spacingM', system)}</Row>
            <Row label="Stiffener section modulus">
              {figureWords(st.sectionModulusM3, 'sectionModulusM3', system)}
              <Mark marks={b.marks} field="stiffening.sectionModulusM3" />
            </Row>
            <Row label="Stiffener allowable stress">{figureWords(st.allowableStressPa, 'allowableStressPa', system)}</Row>
            <Row label="Stiffener ends">{st.endFixity === 'fixed' ? 'fixed' : 'simply supported'}</Row>
          </>
        )}
        {b.plating && (
          <Row label="Plating">
            {figureWords(b.plating.thicknessM, 'thicknessM', system)} thick
            {b.plating.corrosionAllowanceM ? `, less ${figureWords(b.plating.corrosionAllowanceM, 'corrosionAllowanceM', system)} allowance` : ''}
          </Row>
        )}
        {b.ratedCapacity && (
          <Row label="Rated capacity">
            {b.ratedCapacity.kind === 'pressure' ? figureWords(b.ratedCapacity.pressurePa, 'pressurePa', system) : figureWords(b.ratedCapacity.forceN, 'forceN', system)}
          </Row>
        )}
        {(b.shores ?? []).map((s, i) => (
          <Row key={s.id} label={`Shore ${i + 1}`}>
            {s.section.kind === 'rectangular'
              ? `${figureWords(s.section.widthM, 'widthM', system)} × ${figureWords(s.section.depthM, 'depthM', system)}`
              : s.section.kind === 'tube'
                ? `tube ${figureWords(s.section.outerDiameterM, 'outerDiameterM', system)}`
                : 'given section'}
            <Mark marks={b.marks} field={`shores.${s.id}.section`} />, {figureWords(s.lengthM, 'lengthM', system)} long, {END_CONDITION_WORDS[s.endCondition]}, on side {s.side}
          </Row>
        ))}
        {b.notes && <Row label="Notes">{b.notes}</Row>}
      </dl>
      <Photos photos={(doc.photos ?? []).filter((p) => p.entity.kind === 'boundary' && p.entity.id === b.id)} />
    </Card>
  );
}

/** Which inputs to show: all of them (the desk), or one workspace section's. */
export type InputPart = 'all' | 'ship' | 'readings' | 'spaces' | 'boundaries' | 'photos';

export function SurveyInputs(props: { doc: Survey; system: UnitSystem; focus: InputTarget | null; revision?: number; part?: InputPart }) {
  const { doc, system, focus, part = 'all' } = props;
  const condition = doc.conditions.find((c) => c.id === doc.activeConditionId);
  const is = (kind: InputTarget['kind'], id: string) => focus?.kind === kind && focus.id === id;
  const show = (p: InputPart) => part === 'all' || part === p;
  const surveyPhotos = part === 'photos' ? (doc.photos ?? []) : (doc.photos ?? []).filter((p) => p.entity.kind === 'survey' || p.entity.kind === 'condition');
  return (
    <div className="space-y-4" data-testid="survey-inputs">
      <p className="rounded-md border border-line bg-paper p-2 text-sm">
        <strong>Read-only.</strong> The surveyor’s inputs as synced{props.revision ? ` (revision ${props.revision})` : ''}. To ask for a change, comment on the item.
      </p>
      {show('ship') && <ShipCard doc={doc} system={system} />}
      {show('readings') && (
        <section aria-labelledby="inputs-readings" className="space-y-2">
          <h3 id="inputs-readings" className="font-bold">
            Readings
          </h3>
          {(part === 'all' ? (condition ? [condition] : []) : doc.conditions).map((c) => (
            <ReadingsCard key={c.id} doc={doc} c={c} system={system} focused={is('condition', c.id)} />
          ))}
        </section>
      )}
      {show('spaces') && (
        <section aria-labelledby="inputs-spaces" className="space-y-2">
          <h3 id="inputs-spaces" className="font-bold">
            Spaces, contents and sounding pipes ({doc.compartments.length})
          </h3>
          {doc.compartments.map((s) => (
            <SpaceCard key={s.id} doc={doc} s={s} condition={condition} system={system} focused={is('compartment', s.id)} />
          ))}
        </section>
      )}
      {show('boundaries') && (
        <section aria-labelledby="inputs-boundaries" className="space-y-2">
          <h3 id="inputs-boundaries" className="font-bold">
            Boundaries, stiffeners and shores ({doc.boundaries.length})
          </h3>
          {doc.boundaries.map((b) => (
            <BoundaryCard key={b.id} doc={doc} b={b} system={system} focused={is('boundary', b.id)} />
          ))}
        </section>
      )}
      {show('photos') && surveyPhotos.length > 0 && (
        <section aria-labelledby="inputs-photos">
          <h3 id="inputs-photos" className="font-bold">
            {part === 'photos' ? 'Photos' : 'Photos of the survey'}
          </h3>
          <Photos photos={surveyPhotos} />
        </section>
      )}
    </div>
  );
}

/**
 * Beside one boundary's results: the inputs its loads rest on (the boundary, the spaces on each side
 * with their contents, and the readings), read-only, each with a link to its place among all inputs.
 */
export function ResultInputs({ doc, boundaryId, system, onOpen }: { doc: Survey; boundaryId: string; system: UnitSystem; onOpen: (t: InputTarget) => void }) {
  const b = doc.boundaries.find((x) => x.id === boundaryId);
  if (!b) return null;
  const condition = doc.conditions.find((c) => c.id === doc.activeConditionId);
  const spaces = [b.sideA, b.sideB].flatMap((s) => (s.kind === 'compartment' ? doc.compartments.filter((c) => c.id === s.compartmentId) : []));
  const link = (t: InputTarget, words: string) => (
    <button type="button" className="min-h-touch text-left text-sea underline" onClick={() => onOpen(t)}>
      {words}
    </button>
  );
  return (
    <section aria-labelledby="result-inputs-h" className="space-y-2 rounded-lg border border-line bg-paper p-2" data-testid="result-inputs">
      <h3 id="result-inputs-h" className="font-bold">
        The inputs these loads rest on (read-only)
      </h3>
      <p className="flex flex-wrap gap-x-4 text-sm">
        {link({ kind: 'boundary', id: b.id }, `${b.name} among all inputs`)}
        {spaces.map((s) => (
          <span key={s.id}>{link({ kind: 'compartment', id: s.id }, `${s.name} among all inputs`)}</span>
        ))}
        {condition && link({ kind: 'condition', id: condition.id }, 'Readings among all inputs')}
      </p>
      <BoundaryCard doc={doc} b={b} system={system} focused={false} anchored={false} />
      {spaces.map((s) => (
        <SpaceCard key={s.id} doc={doc} s={s} condition={condition} system={system} focused={false} anchored={false} />
      ))}
      {condition && <ReadingsCard doc={doc} c={condition} system={system} focused={false} anchored={false} />}
    </section>
  );
}

/** Under the spaces' results: each space's inputs, one tap away. */
export function SpaceInputLinks({ doc, onOpen }: { doc: Survey; onOpen: (t: InputTarget) => void }) {
  if (doc.compartments.length === 0) return null;
  return (
    <p className="flex flex-wrap gap-x-4 text-sm" data-testid="space-input-links">
      <span className="text-ink-soft">Inputs of each space:</span>
      {doc.compartments.map((c) => (
        <button key={c.id} type="button" className="min-h-touch text-sea underline" onClick={() => onOpen({ kind: 'compartment', id: c.id })}>
          {c.name}
        </button>
      ))}
    </p>
  );
}
