/**
 * The review view of one survey: its model and results (the shared result views, read-only), the
 * server's numbers beside this device's, and the engineer's tools: status, verdicts, limits,
 * comments, history and the master's brief.
 */
import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import { computeBoundaryDetail, computeSurvey, forecastFlooding, summariseBoundary } from '@shared/engine';
import type { SurveyResults } from '@shared/engine';
import { UpgradingSurveySchema, type Survey } from '@shared/schemas/survey';
import { compareResults } from '@shared/review/compare';
import { REVIEWABLE_STATUSES } from '@shared/review/status';
import { Cautions } from '@client/components/layout/cautions';
import { BoundaryDetail } from '@client/features/results/components/boundary-detail';
import { BoundaryResultsTable } from '@client/features/results/components/boundary-results-table';
import { ForecastView } from '@client/features/flooding/components/forecast-view';
import { CompartmentTable } from '@client/features/results/components/compartment-table';
import { ShipTotals } from '@client/features/results/components/ship-totals';
import { ShipResponsePanel } from '@client/features/results/components/ship-response';
import { paths } from '@client/config/paths';
import { useUnitSystem } from '@client/lib/unit-system';
import { useMediaQuery, WIDE_SCREEN } from '@client/lib/use-media-query';
import { useReview } from '../api/get-review';
import { BriefPanel } from './brief-panel';
import { CommentThreads } from './comment-threads';
import { HistoryPanel } from './history-panel';
import { LimitsPanel } from './limits-panel';
import { NumbersCheck, type DeviceNumbers } from './numbers-check';
import { StatusActions } from './status-actions';
import { ReportButton } from '@client/components/report/report-button';
import { formatShipAndUtc } from '@shared/review/time-words';
import { FigureNotesPanel } from './figure-notes-panel';
import { SinceReviewPanel } from './since-review-panel';
import { VerdictPanel } from './verdict-panel';
import { ReviewModel3d } from './review-model3d';
import { ResultInputs, SpaceInputLinks, SurveyInputs, type InputTarget } from '@client/features/survey-inputs/components/survey-inputs';
import { conditionName } from '@shared/review/plain-words';

type Tab = 'results' | 'inputs' | 'model' | 'forecast' | 'history';

function useDeviceNumbers(doc: Survey | null): DeviceNumbers {
  return useMemo(() => {
    if (!doc) return { results: null, error: null };
    try {
      return { results: computeSurvey(doc), error: null };
    } catch (e) {
      return { results: null, error: e instanceof Error ? e.message : String(e) };
    }
  }, [doc]);
}

export function ReviewDesk({ surveyId }: { surveyId: string }) {
  const review = useReview(surveyId);
  const system = useUnitSystem();
  const [tab, setTab] = useState<Tab>('results');
  const [selected, setSelected] = useState<string | null>(null);
  const [inputFocus, setInputFocus] = useState<InputTarget | null>(null);
  const showInput = (t: InputTarget) => {
    setInputFocus(t);
    setTab('inputs');
  };
  const wide = useMediaQuery(WIDE_SCREEN);
  const parsed = useMemo(() => (review.data ? UpgradingSurveySchema.safeParse(review.data.doc) : null), [review.data]);
  const doc = parsed?.success ? parsed.data : null;
  const device = useDeviceNumbers(doc);
  const server = (review.data?.serverResults ?? null) as SurveyResults | null;
  const agreement = useMemo(() => (server && device.results ? compareResults(server, device.results) : null), [server, device.results]);

  if (review.isPending) return <main className="p-4">Loading the survey…</main>;
  if (review.isError)
    return (
      <main className="mx-auto max-w-3xl p-4">
        <p role="alert" className="rounded-lg border-2 border-danger bg-danger-soft p-3">
          {review.error.message}
        </p>
        <Link to={paths.review} className="mt-3 inline-block underline">
          Back to the queue
        </Link>
      </main>
    );
  const r = review.data;
  if (!doc)
    return (
      <main className="p-4" role="alert">
        The stored survey does not match the survey format, so it cannot be shown.
      </main>
    );

  const shown = server ?? device.results;
  const editable = r.viewer.role === 'engineer' && REVIEWABLE_STATUSES.includes(r.status);
  // the own-work rule as the server applies it: made, edited or sent at any revision
  const isSubmitter = r.viewerWorkedOn || r.submittedById === r.viewer.userId;
  // the detail of the boundary opened: the server's stored figures, with the load diagram this device computes on demand
  const stored = shown?.boundaries.find((b) => b.id === selected) ?? null;
  const diagram = stored && doc ? computeBoundaryDetail(doc, stored.id, { conditionId: shown?.conditionId })?.loadDiagram : undefined;
  const selectedBoundary = stored ? { ...stored, loadDiagram: stored.loadDiagram.length > 0 ? stored.loadDiagram : (diagram ?? []) } : null;
  const byId = new Map(doc.boundaries.map((b) => [b.id, b]));
  const rows = shown ? shown.boundaries.flatMap((b) => { const sb = byId.get(b.id); return sb ? [summariseBoundary(b, sb)] : []; }) : [];
  const names = new Map<string, string>([...doc.compartments, ...doc.boundaries, ...doc.conditions.map((c) => ({ id: c.id, name: conditionName(c, doc.vessel.shipTimeOffsetMin) })), ...(doc.photos ?? []).map((p) => ({ id: p.id, name: p.caption })), ...doc.fluids].map((x) => [x.id, x.name]));
  const condition = doc.conditions.find((c) => c.id === doc.activeConditionId);

  const tabBtn = (t: Tab, label: string) => (
    <button
      type="button"
      role="tab"
      aria-selected={tab === t}
      className={`min-h-touch rounded-t-lg px-3 font-bold sm:px-4 ${tab === t ? 'bg-card text-ink shadow' : 'text-ink-soft underline'}`}
      onClick={() => setTab(t)}
    >
      {label}
    </button>
  );

  return (
    <main className="mx-auto max-w-[110rem] p-3 sm:p-5" data-testid="review-desk">
      <Link to={paths.review} className="text-sm underline">
        ← Review queue
      </Link>
      <h1 className="mt-1 text-2xl">{doc.vessel.name}</h1>
      <p className="text-ink-soft">
        {doc.title} · {condition?.name ?? 'readings'} of {condition ? formatShipAndUtc(condition.time, doc.vessel.shipTimeOffsetMin) : '—'} · revision {r.revision}
      </p>
      <div className="mt-3 flex flex-wrap items-start gap-2">
        <StatusActions
          surveyId={surveyId}
          status={r.status}
          role={r.viewer.role}
          events={r.events}
          isSubmitter={isSubmitter}
          overCapacity={(server ?? device.results)?.summary.overCapacityBoundaryIds.map((id) => doc.boundaries.find((b) => b.id === id)?.name ?? id) ?? []}
        />
        <ReportButton surveyId={surveyId} className="ml-auto" />
      </div>
      {r.sinceReview && <SinceReviewPanel since={r.sinceReview} revision={r.revision} system={system} />}
      <FigureNotesPanel doc={doc} />
      <nav aria-label="On this page" className="mt-2 flex flex-wrap gap-x-4 text-sm font-bold lg:hidden">
        {[
          ['#verdicts-h', 'Verdicts'],
          ['#limits-h', 'Limits'],
          ['#comments-h', 'Comments'],
          ['#brief-h', 'Brief'],
        ].map(([href, label]) => (
          <a key={href} href={href} className="inline-flex min-h-touch items-center text-sea underline">
            {label}
          </a>
        ))}
      </nav>
      {/* Wide screens: the evidence takes the room it needs, the engineer's tools a fixed column beside
          it that stays in view (its own scroll) however long the results run. */}
      <div className="mt-3 grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(20rem,26rem)] lg:items-start">
        <div className="min-w-0 space-y-3">
          <NumbersCheck device={device} server={server} agreement={agreement} serverRevision={r.serverComputedRevision} revision={r.revision} system={system} />
          <div role="tablist" aria-label="Survey views" className="flex flex-wrap gap-1 border-b border-line">
            {tabBtn('results', 'Results')}
            {tabBtn('inputs', 'Inputs')}
            {tabBtn('model', '3D model')}
            {tabBtn('forecast', 'Forecast')}
            {tabBtn('history', 'History')}
          </div>
          {tab === 'results' && shown && (
            <div className="space-y-4">
              <ShipTotals results={shown} rows={rows} system={system} />
              {parsed?.success && <ShipResponsePanel survey={parsed.data} results={shown} system={system} />}
              <BoundaryResultsTable results={shown} rows={rows} system={system} selectedId={selected} onSelect={setSelected} />
              {selectedBoundary && <BoundaryDetail boundary={selectedBoundary} results={shown} system={system} />}
              {selectedBoundary && <ResultInputs doc={doc} boundaryId={selectedBoundary.id} system={system} onOpen={showInput} />}
              <CompartmentTable results={shown} system={system} />
              <SpaceInputLinks doc={doc} onOpen={showInput} />
              <Cautions compact />
            </div>
          )}
          {tab === 'results' && !shown && <p>No results to show.</p>}
          {tab === 'model' && <ReviewModel3d survey={doc} results={shown} rows={rows} system={system} selectedId={selected} onSelect={setSelected} />}
          {tab === 'forecast' && <ReviewForecast doc={doc} system={system} />}
          {tab === 'inputs' && <SurveyInputs doc={doc} system={system} focus={inputFocus} revision={r.revision} />}
          {tab === 'history' && <HistoryPanel surveyId={surveyId} names={names} system={system} shipTimeOffsetMin={doc.vessel.shipTimeOffsetMin} onShowInput={showInput} />}
        </div>
        <div
          className="min-w-0 space-y-3 lg:sticky lg:top-16 lg:max-h-[calc(100dvh-5rem)] lg:overflow-y-auto lg:pr-1"
          // it scrolls on its own only on a wide screen: only there is it a stop for the keyboard
          {...(wide ? { role: 'region', 'aria-label': 'Verdicts, limits, comments and brief', tabIndex: 0 } : {})}
        >
          <VerdictPanel surveyId={surveyId} doc={doc} verdicts={r.verdicts} editable={editable} />
          <LimitsPanel surveyId={surveyId} doc={doc} limits={r.limits} editable={editable} system={system} />
          <CommentThreads surveyId={surveyId} doc={doc} comments={r.comments} canResolve={r.viewer.role === 'engineer'} />
          <BriefPanel surveyId={surveyId} status={r.status} briefs={r.briefs} canIssue={r.viewer.role === 'engineer'} canRevoke={r.viewer.role !== 'surveyor'} />
        </div>
      </div>
    </main>
  );
}

/** The surveyor's flooding forecast, recomputed here from the same document: read-only. */
function ReviewForecast({ doc, system }: { doc: Parameters<typeof forecastFlooding>[0]; system: Parameters<typeof ForecastView>[0]['system'] }) {
  const f = useMemo(() => {
    try {
      return forecastFlooding(doc);
    } catch {
      return null;
    }
  }, [doc]);
  if (!f) return <p role="alert">The forecast could not be run on this document.</p>;
  return <ForecastView forecast={f} survey={doc} system={system} />;
}
