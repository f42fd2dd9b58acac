/** The organisation's surveys on this device: search, filter by status, open, start a new one, import a file. Works offline. */
import { SortableHeaderRows } from '@client/components/ui/sortable-header';
import { useMemo, useState } from 'react';
import { useNavigate } from 'react-router';
import { useLiveQuery } from 'dexie-react-hooks';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useLocalSurveys } from '@client/offline/local-surveys';
import { useReviewers } from '@client/offline/reviewers';
import { db, type LocalSurvey } from '@client/offline/db';
import { paths } from '@client/config/paths';
import type { SurveyStatus } from '@shared/schemas/sync';
import { inputCls, primaryBtn } from '@client/components/ui/fields';
import { ImportButton } from './survey-file';
import { formatLocal } from '@shared/review/time-words';
import { STATUS_LABELS } from '@shared/review/status';

// the same words as the status chips on the desk and the device
const STATUS_LABEL = STATUS_LABELS;

interface Row {
  survey: LocalSurvey;
  pending: number;
  reviewer: string | null;
}

const col = createColumnHelper<Row>();

function usePendingBySurvey(): Map<string, number> {
  return (
    useLiveQuery(async () => {
      const m = new Map<string, number>();
      await db.outbox.where('state').equals('pending').each((e) => m.set(e.surveyId, (m.get(e.surveyId) ?? 0) + 1));
      return m;
    }, []) ?? new Map()
  );
}

export function SurveyList() {
  const surveys = useLocalSurveys();
  const pending = usePendingBySurvey();
  const reviewers = useReviewers();
  const navigate = useNavigate();
  const [query, setQuery] = useState('');
  const [status, setStatus] = useState<SurveyStatus | ''>('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'updated', desc: true }]);
  const [error, setError] = useState<string | null>(null);

  const rows = useMemo(
    () => (surveys ?? []).filter((s) => !status || s.status === status).map((s) => ({ survey: s, pending: pending.get(s.id) ?? 0, reviewer: reviewers.get(s.id) ?? null })),
    [surveys, pending, reviewers, status],
  );
  const columns = useMemo(
    () => [
      col.accessor((r) => r.survey.vesselName, { id: 'vessel', header: 'Vessel', cell: (c) => <span className="font-bold">{c.getValue()}</span> }),
      col.accessor((r) => `${r.survey.title} ${r.survey.doc.casualtyDescription}`, {
        id: 'casualty',
        header: 'Casualty',
        cell: (c) => (
          <span>
            {c.row.original.survey.title}
            <span className="block max-w-[28ch] truncate text-xs text-ink-soft">{c.row.original.survey.doc.casualtyDescription}</span>
          </span>
        ),
      }),
      col.accessor((r) => r.survey.status, { id: 'status', header: 'Status', cell: (c) => STATUS_LABEL[c.getValue()] }),
      col.accessor((r) => r.survey.updatedAt, { id: 'updated', header: 'Last edit', cell: (c) => formatLocal(c.getValue()) }),
      col.accessor((r) => r.pending, {
        id: 'sync',
        header: 'Sync',
        cell: (c) =>
          c.row.original.survey.serverRevision === 0 || c.getValue() > 0 ? (
            <span className="rounded border-2 border-caution bg-caution-soft px-1.5 text-sm font-bold">{c.getValue() > 0 ? `${c.getValue()} to send` : 'Not sent yet'}</span>
          ) : (
            <span className="rounded border-2 border-ok bg-ok-soft px-1.5 text-sm font-bold">Synced</span>
          ),
      }),
      col.accessor((r) => r.survey.createdBy?.name ?? '', { id: 'surveyor', header: 'Surveyor', cell: (c) => <span className="text-sm">{c.getValue() || '—'}</span> }),
      col.accessor((r) => r.reviewer ?? '', {
        id: 'reviewer',
        header: 'Reviewer',
        cell: (c) => (
          <span className="text-sm">
            {c.getValue() ||
              (c.row.original.survey.status === 'draft' ? 'not sent yet' : c.row.original.survey.status === 'submitted' ? 'waiting for a reviewer' : '—')}
          </span>
        ),
      }),
    ],
    [],
  );
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting, globalFilter: query },
    onSortingChange: setSorting,
    onGlobalFilterChange: setQuery,
    globalFilterFn: (row, _id, q: string) => {
      const s = row.original.survey;
      return `${s.vesselName} ${s.title} ${s.doc.casualtyDescription}`.toLowerCase().includes(q.toLowerCase());
    },
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });

  const start = async () => {
    try {
      // Loaded on click: the survey schema and the write path (zod) are not needed to show the list.
      const [{ newSurvey }, { createLocalSurvey }] = await Promise.all([import('../utils/new-entities'), import('@client/offline/survey-store')]);
      const s = newSurvey();
      await createLocalSurvey(s);
      navigate(`${paths.survey(s.id)}?s=ship`);
    } catch (err) {
      setError(err instanceof Error ? err.message : 'The survey could not be created on this device.');
    }
  };

  return (
    <main className="mx-auto max-w-6xl space-y-4 p-3 sm:p-5">
      <div className="flex flex-wrap items-center gap-2">
        <h1 className="mr-auto text-3xl">Surveys</h1>
        <ImportButton onError={setError} />
        <button type="button" className={primaryBtn} onClick={() => void start()}>
          + New survey
        </button>
      </div>
      {error && (
        <div className="rounded-md border-2 border-danger bg-danger-soft p-2 text-sm" role="alert">
          {error.split('\n').map((l, i) => (
            <p key={i} className={i === 0 ? 'font-bold' : 'font-mono text-xs'}>
              {l}
            </p>
          ))}
        </div>
      )}
      <div className="grid gap-2 sm:grid-cols-[1fr_14rem]">
        <label className="text-sm font-bold">
          Search vessel or casualty
          <input className={`${inputCls} mt-0.5`} type="search" value={query} onChange={(e) => setQuery(e.target.value)} />
        </label>
        <label className="text-sm font-bold">
          Status
          <select className={`${inputCls} mt-0.5`} value={status} onChange={(e) => setStatus(e.target.value as SurveyStatus | '')}>
            <option value="">Any</option>
            {(Object.keys(STATUS_LABEL) as SurveyStatus[]).map((s) => (
              <option key={s} value={s}>
                {STATUS_LABEL[s]}
              </option>
            ))}
          </select>
        </label>
      </div>
      {surveys === undefined ? (
        <p className="text-ink-soft">Reading this device…</p>
      ) : surveys.length === 0 ? (
        <p className="rounded-lg border border-line bg-card p-4 text-ink-soft">No surveys on this device yet. Start a new one, import a survey file, or connect to fetch your firm’s surveys.</p>
      ) : (
        <div className="rounded-lg border border-line bg-card sm:overflow-x-auto">
          {/* On a phone each survey is a card (headers hidden, each cell labelled); sorting moves to this select. */}
          <label className="flex items-center gap-2 border-b border-line p-2 text-sm font-bold sm:hidden">
            Sort by
            <select
              className={`${inputCls} flex-1`}
              value={sorting[0] ? `${sorting[0].id}:${sorting[0].desc ? 'desc' : 'asc'}` : ''}
              onChange={(e) => {
                const [id, dir] = e.target.value.split(':');
                setSorting(id ? [{ id, desc: dir === 'desc' }] : []);
              }}
            >
              {table.getAllLeafColumns().flatMap((c) =>
                typeof c.columnDef.header === 'string'
                  ? [
                      <option key={`${c.id}:asc`} value={`${c.id}:asc`}>{`${c.columnDef.header} ↑`}</option>,
                      <option key={`${c.id}:desc`} value={`${c.id}:desc`}>{`${c.columnDef.header} ↓`}</option>,
                    ]
                  : [],
              )}
            </select>
          </label>
          <table className="w-full border-collapse text-left sm:min-w-[40rem]" data-testid="survey-list">
            <thead className="bg-sea-soft max-sm:sr-only">
              <SortableHeaderRows table={table} />
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr
                  key={row.id}
                  className="cursor-pointer border-t border-line hover:bg-sea-soft max-sm:block max-sm:px-1 max-sm:py-2"
                  onClick={() => navigate(paths.survey(row.original.survey.id))}
                >
                  {row.getVisibleCells().map((cell, i) => (
                    <td
                      key={cell.id}
                      data-label={typeof cell.column.columnDef.header === 'string' ? cell.column.columnDef.header : ''}
                      className={`px-2 py-1.5 align-top max-sm:flex max-sm:gap-2 max-sm:py-0.5 ${i === 0 ? 'max-sm:text-lg max-sm:font-bold' : "max-sm:before:w-24 max-sm:before:shrink-0 max-sm:before:text-sm max-sm:before:text-ink-soft max-sm:before:content-[attr(data-label)]"}`}
                    >
                      {i === 0 ? (
                        <a
                          href={paths.survey(row.original.survey.id)}
                          className="inline-block min-h-touch content-center underline"
                          onClick={(e) => {
                            e.preventDefault();
                            e.stopPropagation();
                            navigate(paths.survey(row.original.survey.id));
                          }}
                        >
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </a>
                      ) : (
                        flexRender(cell.column.columnDef.cell, cell.getContext())
                      )}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
          {table.getRowModel().rows.length === 0 && <p className="p-3 text-ink-soft">No survey matches.</p>}
        </div>
      )}
    </main>
  );
}
