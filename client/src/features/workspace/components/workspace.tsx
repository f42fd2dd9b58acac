/**
 * The surveyor's workspace for one survey: sections to enter the ship, readings, spaces, contents
 * and plates, with the loads recomputed on this device on every change. Phone first: one section at
 * a time under a strip that always shows the ship's state; on a wide screen the loads stay beside
 * the form.
 */
import { useCallback, useMemo, useRef, useState, type ReactNode } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { BoundarySummary, SurveySummary } from '@shared/engine';
import { useSurveySummary } from '../hooks/use-survey-summary';
import { useMediaQuery, WIDE_SCREEN } from '@client/lib/use-media-query';
import type { Survey } from '@shared/schemas/survey';
import { applyLocalChange, useLocalSurvey, usePendingCount } from '@client/offline/survey-store';
import { shareUnchanged } from '@client/lib/share-unchanged';
import { useSyncState } from '@client/offline/sync';
import { setUnitSystem, useUnitSystem, fmt } from '@client/lib/unit-system';
import { changeUnitSystem, useSession } from '@client/lib/session';
import { paths } from '@client/config/paths';
import { Cautions } from '@client/components/layout/cautions';
import { BoundaryResultsTable } from '@client/features/results/components/boundary-results-table';
import { UtilisationBadge } from '@client/features/results/components/utilisation';
import type { EditOp, SectionProps } from '../utils/types';
import { ShipSection } from './ship-section';
import { ReadingsSection } from './readings-section';
import { SpacesSection } from './spaces-section';
import { ContentsSection } from './contents-section';
import { PlatesSection } from './plates-section';
import { LoadsSection } from './loads-section';
import { StabilitySection } from './stability-section';
import { FloodingSection } from './flooding-section';
import { PhotosSection } from './photos-section';
import { ExportButton } from './survey-file';
import { ReportButton } from '@client/components/report/report-button';
import { ModelSection } from './model-section';
import { SurveyReviewBar } from '@client/features/review-notes/components/survey-review-bar';
import { SurveyInputs, type InputPart, type InputTarget } from '@client/features/survey-inputs/components/survey-inputs';
import { changeSendsBackWarning } from '@shared/review/status';
import { ReviewedGuard } from './reviewed-guard';
import { reviewsOnly } from '@shared/review/editing';

const SECTIONS = [
  { id: 'ship', label: 'Ship' },
  { id: 'readings', label: 'Readings' },
  { id: 'spaces', label: 'Spaces' },
  { id: 'contents', label: 'Contents' },
  { id: 'plates', label: 'Boundaries' },
  { id: 'loads', label: 'Loads' },
  { id: 'stability', label: 'Stability' },
  { id: 'flooding', label: 'Flooding' },
  { id: 'model', label: '3D' },
  { id: 'photos', label: 'Photos' },
] as const;
type SectionId = (typeof SECTIONS)[number]['id'];
/** Sections that only show results: readable while a reviewed survey's forms are locked. */
const READ_ONLY_SECTIONS: ReadonlySet<SectionId> = new Set(['loads', 'model']);

/** The input an item id of the address names (`?item=`), for the read-only view to open. */
function inputTargetOf(survey: Survey, id: string): InputTarget | null {
  if (survey.boundaries.some((b) => b.id === id)) return { kind: 'boundary', id };
  if (survey.compartments.some((c) => c.id === id)) return { kind: 'compartment', id };
  if (survey.conditions.some((c) => c.id === id)) return { kind: 'condition', id };
  return null;
}

/** The survey's title without the vessel's name it usually starts with ("MV Corran Tide — grounding…" → "grounding…"). */
function titleAfterVessel(title: string, vessel: string): string {
  if (!title.toLowerCase().startsWith(vessel.toLowerCase())) return title;
  const rest = title.slice(vessel.length).replace(/^[\s—–:·,-]+/, '');
  return rest || title;
}

/** `doc` sharing every unchanged part with the document this hook returned last (`shareUnchanged`). */
function useSharedDoc(doc: Survey | undefined): Survey | undefined {
  const last = useRef<Survey | undefined>(undefined);
  return useMemo(() => {
    const prev = last.current;
    const shared = doc && prev && prev.id === doc.id ? shareUnchanged(prev, doc) : doc;
    last.current = shared;
    return shared;
  }, [doc]);
}

export function Workspace({ surveyId }: { surveyId: string }) {
  const local = useLocalSurvey(surveyId);
  const system = useUnitSystem();
  const [params, setParams] = useSearchParams();
  const section = (SECTIONS.find((s) => s.id === params.get('s'))?.id ?? 'ship') as SectionId;
  const selectedId = params.get('item');
  const [editError, setEditError] = useState<string | null>(null);
  // "Make changes" said for this survey in this status (a change of status asks again)
  const [confirmedFor, setConfirmedFor] = useState<string | null>(null);
  const pending = usePendingCount(surveyId) ?? 0;
  const warning = local ? changeSendsBackWarning(local.status) : null;
  // edits already waiting on this device mean the surveyor chose to change it (e.g. before a reload)
  const locked = warning !== null && confirmedFor !== `${surveyId}:${local?.status}` && pending === 0;
  // each read of the store is a new copy: shared with the one shown, what did not change keeps its
  // identity, so a pull that brought nothing new recomputes and re-renders nothing
  const survey = useSharedDoc(local?.doc);
  const { user } = useSession();
  // an engineer reviews a surveyor's survey on the desk: here its fields are shown, never editable
  const readOnly = !!user && reviewsOnly(user.role, user.id, local?.ownerUserId);
  // off the main thread for a big ship (a Web Worker), in place for a small one
  const { results, rows, error } = useSurveySummary(survey);
  // the aside is for wide screens only: on a phone it is not rendered at all (not merely hidden)
  const wide = useMediaQuery(WIDE_SCREEN);

  const go = useCallback(
    (s: SectionId, item?: string | null) => {
      const next = new URLSearchParams();
      next.set('s', s);
      if (item) next.set('item', item);
      setParams(next, { replace: true });
    },
    [setParams],
  );
  const select = useCallback(
    (id: string | null) => {
      const next = new URLSearchParams(params);
      if (id) next.set('item', id);
      else next.delete('item');
      setParams(next, { replace: true });
    },
    [params, setParams],
  );
  /** Opens the form of a compartment or boundary (from the model or a results row). */
  const open = useCallback(
    (id: string) => {
      if (!survey) return;
      if (survey.boundaries.some((b) => b.id === id)) go('plates', id);
      else if (survey.compartments.some((c) => c.id === id)) go('spaces', id);
    },
    [survey, go],
  );
  const apply = useCallback(
    async (op: EditOp, base?: EditOp) => {
      if (readOnly) {
        setEditError('Read-only: this survey’s figures are the surveyor’s. Comment on the review desk instead.');
        throw new Error('read-only');
      }
      if (locked) {
        setEditError('Choose “Make changes” first: this survey has been reviewed.');
        throw new Error('locked until the surveyor chooses to make changes');
      }
      try {
        await applyLocalChange(surveyId, op, base);
        setEditError(null);
      } catch (err) {
        setEditError(err instanceof Error ? err.message : 'This change could not be kept.');
        throw err;
      }
    },
    [surveyId, readOnly, locked],
  );

  if (local === undefined) return <p className="p-4 text-ink-soft">Opening the survey on this device…</p>;
  if (local === null || !survey) {
    return (
      <main className="mx-auto max-w-xl p-4">
        <h1 className="text-2xl">Survey not on this device</h1>
        <p className="mt-2 text-ink-soft">It may not have synced here yet. Connect and sync, or open another survey.</p>
        <Link className="mt-3 inline-block font-bold underline" to={paths.surveys}>
          All surveys
        </Link>
      </main>
    );
  }

  const props: SectionProps = { survey, results, rows, apply, system, selectedId, select };
  const body: Record<SectionId, ReactNode> = {
    ship: <ShipSection key={system} {...props} />,
    readings: <ReadingsSection {...props} />,
    spaces: <SpacesSection {...props} />,
    contents: <ContentsSection {...props} />,
    plates: <PlatesSection {...props} />,
    loads: <LoadsSection {...props} />,
    stability: <StabilitySection {...props} />,
    flooding: <FloodingSection {...props} />,
    model: <ModelSection {...props} open={open} />,
    photos: <PhotosSection {...props} />,
  };
  if (readOnly) {
    const focus = selectedId ? inputTargetOf(survey, selectedId) : null;
    const view = (part: InputPart) => <SurveyInputs doc={survey} system={system} focus={focus} part={part} />;
    const frozen = (node: ReactNode) => (
      <fieldset disabled className="m-0 min-w-0 border-0 p-0">
        <legend className="sr-only">Read-only</legend>
        {node}
      </fieldset>
    );
    Object.assign(body, {
      ship: view('ship'),
      readings: view('readings'),
      spaces: view('spaces'),
      contents: view('spaces'),
      plates: view('boundaries'),
      photos: view('photos'),
      stability: frozen(body.stability),
      flooding: frozen(body.flooding),
    });
  }
  const sideResults = section !== 'loads' && section !== 'model' && section !== 'flooding';

  return (
    <main className="mx-auto max-w-7xl pb-8" data-testid="workspace">
      <div className="flex flex-wrap items-center gap-2 px-3 pt-3 sm:px-5">
        <Link to={paths.surveys} className="min-h-touch content-center text-sm font-bold underline">
          ← Surveys
        </Link>
        <h1 className="order-first min-w-0 basis-full text-xl line-clamp-2 sm:order-none sm:basis-auto sm:flex-1 sm:text-2xl" title={survey.title}>
          {survey.vessel.name} <span className="font-normal text-ink-soft">· {titleAfterVessel(survey.title, survey.vessel.name)}</span>
        </h1>
        <SurveySyncChip surveyId={surveyId} onServer={local.serverRevision > 0} />
        <UnitToggle />
        <ExportButton survey={survey} />
        <ReportButton surveyId={surveyId} />
      </div>
      {/* Right under the title, so every section is in the first screen on a phone: rows of four there,
          one scrollable strip from 640 px (not sticky: the app header already is). */}
      <nav aria-label="Workspace sections" className="mt-2 border-b-2 border-line bg-paper px-1 sm:overflow-x-auto sm:px-4">
        <ul className="grid grid-cols-4 gap-1 sm:flex sm:min-w-max">
          {SECTIONS.map((s) => (
            <li key={s.id}>
              <button
                type="button"
                onClick={() => go(s.id)}
                aria-current={s.id === section ? 'page' : undefined}
                className={`min-h-touch w-full rounded-t-md px-1 font-bold sm:px-3 ${s.id === section ? 'bg-hull text-paper' : 'text-hull hover:bg-sea-soft'}`}
              >
                {s.label}
              </button>
            </li>
          ))}
        </ul>
      </nav>
      {readOnly && (
        <p className="mx-3 mt-2 rounded-md border-2 border-hull bg-sea-soft p-2 sm:mx-5" data-testid="read-only-notice">
          <strong>Read-only for you.</strong> This is {local.createdBy?.name ?? 'the surveyor'}’s survey: as an engineer you can look at every
          figure here, but not change them. Comment, set verdicts and limits on the{' '}
          <Link className="font-bold underline" to={paths.reviewSurvey(surveyId)}>
            review desk
          </Link>
          .
        </p>
      )}
      <StateStrip results={results} rows={rows} error={error} system={system} onOpen={() => go('loads')} />
      <div className="mx-3 mt-2 sm:mx-5">
        <SurveyReviewBar surveyId={surveyId} survey={survey} />
      </div>
      {warning && !readOnly && (
        <div className="mx-3 mt-2 sm:mx-5">
          <ReviewedGuard warning={warning} locked={locked} onConfirm={() => setConfirmedFor(`${surveyId}:${local.status}`)} />
        </div>
      )}
      {editError && (
        <p className="mx-3 mt-2 rounded-md border-2 border-danger bg-danger-soft p-2 font-bold sm:mx-5" role="alert">
          <span aria-hidden="true">▲ </span>
          {editError}
        </p>
      )}
      <div className={`gap-6 px-3 pt-4 sm:px-5 ${sideResults ? 'lg:grid lg:grid-cols-[minmax(0,1fr)_minmax(0,26rem)]' : ''}`}>
        <div className="min-w-0">
          {/* disabled: every field and button of the forms at once, until "Make changes" */}
          <fieldset disabled={locked && !readOnly && !READ_ONLY_SECTIONS.has(section)} className="m-0 min-w-0 border-0 p-0">
            {body[section]}
          </fieldset>
        </div>
        {sideResults && wide && results && (
          <aside className="mt-6 space-y-3 lg:mt-0" aria-label="Loads at a glance">
            <h2 className="text-lg">Loads now</h2>
            <BoundaryResultsTable results={results} rows={rows} system={system} onSelect={(id) => go('loads', id)} />
            <Cautions compact />
          </aside>
        )}
      </div>
    </main>
  );
}

/** Always on screen: heel, trim, flood water and the worst plate, big enough to read in sunlight. */
function StateStrip({ results, rows, error, system, onOpen }: { results: SurveySummary | null; rows: readonly BoundarySummary[]; error: string | null; system: ReturnType<typeof useUnitSystem>; onOpen: () => void }) {
  if (error) {
    return (
      <p className="mx-3 mt-2 rounded-md border-2 border-danger bg-danger-soft p-2 font-bold sm:mx-5" role="alert">
        Loads not computed: {error}
      </p>
    );
  }
  if (!results) return null;
  const worst = rows.find((b) => b.id === results.summary.maxUtilisationBoundaryId);
  const over = results.summary.overCapacityBoundaryIds.length;
  const unread = (results.frame.missingReadings ?? []).length > 0;
  return (
    <button
      type="button"
      onClick={onOpen}
      className={`mx-3 mt-2 flex w-[calc(100%-1.5rem)] flex-wrap items-center gap-x-4 gap-y-1 rounded-lg border-2 px-3 py-2 text-left sm:mx-5 sm:w-[calc(100%-2.5rem)] ${over ? 'border-danger bg-danger-soft' : 'border-hull bg-card'}`}
      data-testid="state-strip"
      aria-describedby="state-strip-hint"
    >
      <span id="state-strip-hint" className="sr-only">
        Opens the loads.
      </span>
      <span>
        <span className="text-xs font-bold uppercase text-ink-soft">Heel </span>
        <b className="tabular-nums">
          {unread ? '—' : `${Math.abs(results.frame.heelDeg).toFixed(1)}° ${results.frame.heelDeg > 0.05 ? 'stbd' : results.frame.heelDeg < -0.05 ? 'port' : ''}`}
        </b>
      </span>
      <span>
        <span className="text-xs font-bold uppercase text-ink-soft">Trim </span>
        <b className="tabular-nums">
          {unread ? '—' : `${fmt(Math.abs(results.frame.trimM), 'length', system, 3)} ${results.frame.trimM > 0.005 ? 'stern' : results.frame.trimM < -0.005 ? 'head' : ''}`}
        </b>
      </span>
      <span>
        <span className="text-xs font-bold uppercase text-ink-soft">Flood water </span>
        <b className="tabular-nums">{fmt(results.ship.floodWater.massKg, 'mass', system, 4)}</b>
      </span>
      <span>
        <span className="text-xs font-bold uppercase text-ink-soft">Oil </span>
        <b className="tabular-nums">{fmt(results.ship.oil.massKg, 'mass', system, 4)}</b>
      </span>
      {(results.withheld ?? []).length > 0 && (
        <span className="text-sm font-bold" data-testid="readings-needed">
          Readings needed: {(results.withheld ?? []).length} not shown
        </span>
      )}
      <span className="flex items-center gap-1">
        <UtilisationBadge value={results.summary.maxUtilisation} compact />
        {worst && <span className="text-sm font-bold">{worst.name}</span>}
      </span>
    </button>
  );
}

function UnitToggle() {
  const system = useUnitSystem();
  const { user } = useSession();
  // a signed-in person's choice goes to their profile; otherwise it stays on this device
  const choose = (s: 'si' | 'us') => (user ? changeUnitSystem(s) : setUnitSystem(s));
  return (
    <div role="group" aria-label="Units" className="flex overflow-hidden rounded-lg border-2 border-hull">
      {(['si', 'us'] as const).map((s) => (
        <button
          key={s}
          type="button"
          aria-pressed={system === s}
          onClick={() => choose(s)}
          className={`min-h-touch px-3 text-sm font-bold ${system === s ? 'bg-hull text-paper' : 'bg-card text-hull'}`}
        >
          {s === 'si' ? 'SI' : 'US'}
        </button>
      ))}
    </div>
  );
}

function SurveySyncChip({ surveyId, onServer }: { surveyId: string; onServer: boolean }) {
  const pending = usePendingCount(surveyId) ?? 0;
  const sync = useSyncState();
  const offline = sync.state === 'offline';
  // a survey whose every edit reached the server is synced, whether or not the link is up now
  const text = pending > 0 ? (offline ? `${pending} to sync (offline)` : `${pending} to sync`) : !onServer ? 'Only on this device' : offline ? 'Synced (now offline)' : 'Synced';
  return (
    <span className={`rounded-md border-2 px-2 py-1 text-sm font-bold ${pending > 0 ? 'border-caution bg-caution-soft' : 'border-ok bg-ok-soft'}`} data-testid="survey-sync">
      {text}
    </span>
  );
}

