/** "Boundaries": every boundary; one step from a compartment's face, doors and hatches set in a plate. */
import { useState } from 'react';
import type { Boundary } from '@shared/schemas/survey';
import type { SectionProps } from '../utils/types';
import { primaryBtn, secondaryBtn, dangerBtn, inputCls } from '@client/components/ui/fields';
import { BoundaryEditor, KIND_LABEL } from './boundary-editor';
import { FACES, faceBoundary, geometryToPlaneShape, planeShapeToGeometry, type Face } from '../utils/plane-geometry';
import { newBoundary, newId } from '../utils/new-entities';
import { UtilisationBadge } from '@client/features/results/components/utilisation';
import { fmt } from '@client/lib/unit-system';
import { VirtualList } from '@client/components/ui/virtual-list';

const FACE_LABEL: Record<Face, string> = {
  aft: 'Aft bulkhead',
  forward: 'Forward bulkhead',
  starboard: 'Starboard side',
  port: 'Port side',
  bottom: 'Bottom / tank top',
  top: 'Deck over',
};

export function PlatesSection({ survey, rows, apply, system, selectedId, select }: SectionProps) {
  const [faceComp, setFaceComp] = useState<string>('');
  const [face, setFace] = useState<Face>('forward');
  const selected = survey.boundaries.find((b) => b.id === selectedId) ?? null;
  // one look-up table per render, not a search per plate (a large ship has thousands)
  const rowById = new Map(rows.map((r) => [r.id, r]));
  const compId = faceComp || survey.compartments[0]?.id || '';

  const create = async (b: Boundary) => {
    await apply({ kind: 'upsert', collection: 'boundaries', entity: b });
    select(b.id);
  };
  const fromFace = () => {
    const c = survey.compartments.find((x) => x.id === compId);
    if (!c) return;
    const f = faceBoundary(c, face, survey.compartments);
    void create({ id: newId(), name: f.name, kind: f.kind as Boundary['kind'], geometry: f.geometry, sideA: { kind: 'compartment', compartmentId: c.id }, sideB: f.sideB });
  };
  const addOpening = (parent: Boundary) => {
    const ps = geometryToPlaneShape(parent.geometry);
    if (!ps) return;
    const horizontal = ps.plane === 'horizontal';
    const ca = ps.shape === 'rectangle' ? (ps.a1 + ps.a2) / 2 : ps.shape === 'circle' ? ps.ca : ps.points.reduce((s, p) => s + p.a, 0) / ps.points.length;
    const cb = ps.shape === 'rectangle' ? (horizontal ? (ps.b1 + ps.b2) / 2 : ps.b1) : ps.shape === 'circle' ? ps.cb : Math.min(...ps.points.map((p) => p.b));
    const [w, h] = horizontal ? [3, 3] : [0.8, 1.8];
    const geometry = planeShapeToGeometry({ ...ps, shape: 'rectangle', a1: ca - w / 2, a2: ca + w / 2, b1: horizontal ? cb - h / 2 : cb + 0.3, b2: horizontal ? cb + h / 2 : cb + 0.3 + h });
    void create({
      id: newId(),
      name: `${horizontal ? 'Hatch' : 'Door'} in ${parent.name}`,
      kind: horizontal ? 'hatch-cover' : 'door',
      geometry,
      sideA: parent.sideA,
      sideB: parent.sideB,
      parentBoundaryId: parent.id,
    });
  };
  const remove = async (b: Boundary) => {
    for (const child of survey.boundaries.filter((x) => x.parentBoundaryId === b.id)) {
      await apply({ kind: 'upsert', collection: 'boundaries', entity: { ...child, parentBoundaryId: undefined } });
    }
    await apply({ kind: 'delete', collection: 'boundaries', entityId: b.id });
    select(null);
  };

  return (
    <section aria-labelledby="plates-h" className="space-y-4">
      <h2 id="plates-h" className="text-2xl">
        Boundaries
      </h2>
      {survey.compartments.length > 0 && (
        <div className="rounded-lg border border-line bg-card p-3">
          <p className="font-bold">New boundary from a space’s face</p>
          <div className="mt-1 grid gap-2 sm:grid-cols-[1fr_1fr_auto]">
            <label className="text-sm font-bold">
              Face
              <select className={`${inputCls} mt-0.5`} value={face} onChange={(e) => setFace(e.target.value as Face)} aria-label="Face">
                {FACES.map((f) => (
                  <option key={f} value={f}>
                    {FACE_LABEL[f]}
                  </option>
                ))}
              </select>
            </label>
            <label className="text-sm font-bold">
              of
              <select className={`${inputCls} mt-0.5`} value={compId} onChange={(e) => setFaceComp(e.target.value)} aria-label="Space of the face">
                {survey.compartments.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.name}
                  </option>
                ))}
              </select>
            </label>
            <button type="button" className={`${primaryBtn} self-end`} onClick={fromFace}>
              Create
            </button>
          </div>
          <p className="mt-1 text-xs text-ink-soft">Side A is that space; side B the space sharing that face, else the sea (sides and bottom) or open air.</p>
        </div>
      )}
      <button type="button" className={secondaryBtn} onClick={() => void create(newBoundary(survey))}>
        + Boundary by plane and outline
      </button>
      <VirtualList
        items={survey.boundaries}
        itemKey={(b) => b.id}
        label="Boundaries"
        className="space-y-1"
        estimatePx={56}
        active={selected ? survey.boundaries.indexOf(selected) : -1}
        render={(b) => {
          const r = rowById.get(b.id);
          return (
            <button
              type="button"
              className={`flex min-h-touch flex-wrap items-center gap-2 rounded-md border-2 px-2 py-1 text-left ${b.id === selectedId ? 'border-hull bg-sea-soft' : 'border-line bg-card'} ${b.parentBoundaryId ? 'ml-4 w-[calc(100%-1rem)]' : 'w-full'}`}
              aria-pressed={b.id === selectedId}
              onClick={() => select(b.id === selectedId ? null : b.id)}
            >
              <span className="font-bold">{b.name}</span>
              <span className="text-sm text-ink-soft">{KIND_LABEL[b.kind]}</span>
              {r && <span className="ml-auto text-sm tabular-nums">{fmt(r.forceN, 'force', system)}</span>}
              {r && <UtilisationBadge value={r.maxUtilisation} compact />}
            </button>
          );
        }}
      />
      {selected && (
        <div className="rounded-lg border-2 border-hull bg-card p-3">
          <BoundaryEditor key={`${selected.id}-${system}`} boundary={selected} survey={survey} apply={apply} system={system} />
          <div className="mt-2 flex flex-wrap gap-2">
            {!selected.parentBoundaryId && geometryToPlaneShape(selected.geometry) && (
              <button type="button" className={secondaryBtn} onClick={() => addOpening(selected)}>
                + Door or hatch in {selected.name}
              </button>
            )}
            <button type="button" className={dangerBtn} onClick={() => void remove(selected)}>
              Delete {selected.name}
            </button>
          </div>
        </div>
      )}
    </section>
  );
}
