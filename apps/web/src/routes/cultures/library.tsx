import { useMemo, useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { ArrowDown, ArrowUp, ArrowUpDown, Download, Plus, TriangleAlert, Upload } from 'lucide-react';
import { backupLimits, CULTURE_FORMS, CULTURE_STATES, type CultureSummaryDto } from '@barmkeep/schemas';
import { cultureQueries, type CultureListFilters } from '../../api/cultures/queries';
import { useImportBackupMutation } from '../../api/cultures/mutations';
import { isApiError } from '../../api/client';
import {
  Button,
  ButtonLink,
  EmptyState,
  Loading,
  Notice,
  PageHeader,
  Select,
  TextField,
  buttonClasses,
  cx,
} from '../../components';
import { attentionText, formLabels, pct, stateLabels } from '../../lib/cultureLabels';

/** Table column → the API's sort key. Age sorts by the made date, the other way round. */
const SORT_KEYS: Record<string, { key: string; invert?: boolean }> = {
  strainName: { key: 'name' },
  form: { key: 'form' },
  state: { key: 'state' },
  generation: { key: 'generation' },
  ageDays: { key: 'made', invert: true },
  projectedViability: { key: 'viability' },
  daysUntilAttention: { key: 'attention' },
};
const COLUMN_OF = Object.fromEntries(Object.entries(SORT_KEYS).map(([col, s]) => [s.key, col]));

const col = createColumnHelper<CultureSummaryDto>();
const columns = [
  col.accessor('strainName', {
    header: 'Strain',
    cell: (info) => (
      <span className="flex flex-col">
        <Link
          to={`/cultures/${info.row.original.id}`}
          className="font-medium text-accent underline-offset-4 hover:underline"
        >
          {info.getValue()}
        </Link>
        <span className="text-sm text-ink-muted">
          <span className="md:hidden">{stateLabels[info.row.original.state]} · </span>
          {info.row.original.labelCode ? <span className="num">{info.row.original.labelCode} · </span> : null}
          {info.row.original.locationLabel || '—'}
          {info.row.original.suspect ? (
            <span className="ml-2 inline-flex items-center gap-1 font-medium text-danger">
              <TriangleAlert aria-hidden className="size-3.5" /> suspect
            </span>
          ) : null}
        </span>
      </span>
    ),
  }),
  col.accessor('form', { header: 'Form', cell: (i) => formLabels[i.getValue()], meta: { wide: true } }),
  col.accessor('state', { header: 'State', cell: (i) => stateLabels[i.getValue()], meta: { wide: true } }),
  col.accessor('generation', {
    header: 'Gen',
    cell: (i) => <span className="num">{i.getValue()}</span>,
    meta: { wide: true },
  }),
  col.accessor('ageDays', {
    header: 'Age',
    cell: (i) => <span className="num">{i.getValue()} d</span>,
    meta: { wide: true },
  }),
  col.accessor('projectedViability', {
    header: 'Viability',
    cell: (i) => (
      <span
        className="num"
        title={i.row.original.viabilityBasis === 'measured' ? 'from a stain count' : 'projected from the form and age'}
      >
        {pct(i.getValue())}
        {i.row.original.viabilityBasis === 'model' ? <span className="text-ink-faint">*</span> : null}
      </span>
    ),
  }),
  col.accessor('daysUntilAttention', {
    header: 'Attention',
    cell: (i) => {
      const d = i.getValue();
      return (
        <span
          className={cx('num', d !== null && d <= 3 && 'font-semibold text-warn', d !== null && d < 0 && 'text-danger')}
        >
          {attentionText(d)}
        </span>
      );
    },
  }),
];

function numberParam(v: string | null): number | undefined {
  if (v === null || v === '') return undefined;
  const n = Number(v);
  return Number.isFinite(n) ? n : undefined;
}

const counted = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** CSV of the library, a JSON backup of every culture and log entry, and importing such a backup. */
function ExportAndBackup() {
  const importBackup = useImportBackupMutation();
  const onImport = async (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = e.currentTarget;
    const file = new FormData(form).get('file');
    if (!(file instanceof File) || file.size === 0) return;
    try {
      await importBackup.mutateAsync(file);
      form.reset();
    } catch {
      /* shown below */
    }
  };
  const err = importBackup.error;
  return (
    <details className="rounded-lg border border-rule bg-paper-raised p-4">
      <summary className="cursor-pointer font-medium">Export, back up or import</summary>
      <div className="mt-3 space-y-4">
        <div className="flex flex-wrap gap-2">
          <a className={buttonClasses('secondary')} href="/api/cultures/export.csv" download>
            <Download aria-hidden className="size-5" /> Library as CSV
          </a>
          <a className={buttonClasses('secondary')} href="/api/cultures/backup.json" download>
            <Download aria-hidden className="size-5" /> Backup without photos (JSON)
          </a>
          <a className={buttonClasses('secondary')} href="/api/cultures/backup.json?photos=1" download>
            <Download aria-hidden className="size-5" /> Backup with photos (JSON)
          </a>
        </div>
        <p className="text-sm text-ink-muted">
          A backup holds every culture and log entry. With photos it also holds each photo at web size, with its caption
          and the log entry it belongs to; that file is much larger (an import takes up to{' '}
          {backupLimits.maxBytes / 1024 / 1024} MB).
        </p>
        <form onSubmit={onImport} className="space-y-3" aria-label="Import a backup">
          <TextField
            label="Import a backup file"
            name="file"
            type="file"
            accept="application/json,.json"
            hint="Everything in the file is added as new cultures, or nothing is if any row is wrong."
          />
          <Button
            type="submit"
            variant="secondary"
            icon={<Upload aria-hidden className="size-5" />}
            busy={importBackup.isPending}
            busyLabel="Importing…"
          >
            Import
          </Button>
        </form>
        {importBackup.isSuccess ? (
          <Notice tone="success" live="polite">
            Imported {counted(importBackup.data.cultures, 'culture', 'cultures')},{' '}
            {counted(importBackup.data.events, 'log entry', 'log entries')} and{' '}
            {counted(importBackup.data.photos, 'photo', 'photos')}.
          </Notice>
        ) : null}
        {err ? (
          <Notice tone="danger" live="assertive" title="Nothing was imported">
            <p>{err.message}</p>
            {isApiError(err) && err.hasFieldErrors ? (
              <ul className="mt-1 list-disc pl-5 text-sm">
                {Object.entries(err.fields)
                  .slice(0, 20)
                  .map(([where, msgs]) => (
                    <li key={where}>
                      <span className="num">{where}</span>: {msgs.join(' ')}
                    </li>
                  ))}
              </ul>
            ) : null}
          </Notice>
        ) : null}
      </div>
    </details>
  );
}

export function CultureLibrary() {
  const [params, setParams] = useSearchParams();
  const filters: CultureListFilters = {
    q: params.get('q') ?? undefined,
    state: params.get('state') ?? undefined,
    form: params.get('form') ?? undefined,
    sort: params.get('sort') ?? 'attention',
    dir: (params.get('dir') as 'asc' | 'desc' | null) ?? 'asc',
    page: numberParam(params.get('page')) ?? 1,
    pageSize: 25,
    maxAgeDays: numberParam(params.get('maxAgeDays')),
    viabilityMaxPct: numberParam(params.get('viabilityMaxPct')),
  };
  const { data, isPending, isError, error, isFetching } = useQuery(cultureQueries.list(filters));
  const [search, setSearch] = useState(filters.q ?? '');

  const update = (patch: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(patch)) {
      if (v === undefined || v === '') next.delete(k);
      else next.set(k, v);
    }
    if (!('page' in patch)) next.delete('page');
    setParams(next, { replace: true });
  };

  const sorting: SortingState = useMemo(() => {
    const column = COLUMN_OF[filters.sort ?? 'attention'];
    if (!column) return [];
    const invert = SORT_KEYS[column]?.invert;
    const desc = (filters.dir === 'desc') !== Boolean(invert);
    return [{ id: column, desc }];
  }, [filters.sort, filters.dir]);

  const table = useReactTable({
    data: data?.cultures ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    state: { sorting },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const first = next[0];
      if (!first) return;
      const s = SORT_KEYS[first.id]!;
      const desc = first.desc !== Boolean(s.invert);
      update({ sort: s.key, dir: desc ? 'desc' : 'asc' });
    },
    rowCount: data?.total ?? 0,
  });

  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const anyFilter = Boolean(
    filters.q ||
    filters.state ||
    filters.form ||
    filters.maxAgeDays !== undefined ||
    filters.viabilityMaxPct !== undefined,
  );

  const onSearch = (e: FormEvent) => {
    e.preventDefault();
    update({ q: search.trim() || undefined });
  };

  if (isError)
    return (
      <Notice tone="danger" title="Could not load your cultures">
        {error.message}
      </Notice>
    );
  if (isPending) return <Loading label="Loading your cultures…" />;

  return (
    <div className="space-y-4">
      <form onSubmit={onSearch} role="search" className="grid gap-3 sm:grid-cols-[1fr_auto] sm:items-end">
        <TextField
          label="Search"
          placeholder="Strain, label code, place, tag or note"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
        />
        <Button type="submit" variant="secondary">
          Search
        </Button>
      </form>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Select
          label="State"
          value={filters.state ?? ''}
          onChange={(e) => update({ state: e.target.value || undefined })}
          options={[
            { value: '', label: 'Any state' },
            ...CULTURE_STATES.map((s) => ({ value: s, label: stateLabels[s] })),
          ]}
        />
        <Select
          label="Form"
          value={filters.form ?? ''}
          onChange={(e) => update({ form: e.target.value || undefined })}
          options={[
            { value: '', label: 'Any form' },
            ...CULTURE_FORMS.map((f) => ({ value: f, label: formLabels[f] })),
          ]}
        />
        <Select
          label="Age"
          value={filters.maxAgeDays === undefined ? '' : String(filters.maxAgeDays)}
          onChange={(e) => update({ maxAgeDays: e.target.value || undefined })}
          options={[
            { value: '', label: 'Any age' },
            { value: '7', label: 'Up to a week' },
            { value: '30', label: 'Up to a month' },
            { value: '90', label: 'Up to 3 months' },
          ]}
        />
        <Select
          label="Viability"
          value={filters.viabilityMaxPct === undefined ? '' : String(filters.viabilityMaxPct)}
          onChange={(e) => update({ viabilityMaxPct: e.target.value || undefined })}
          options={[
            { value: '', label: 'Any viability' },
            { value: '75', label: '75% or less' },
            { value: '50', label: '50% or less' },
            { value: '25', label: '25% or less' },
          ]}
        />
      </div>

      {data.total === 0 ? (
        <EmptyState title={anyFilter ? 'No culture matches' : 'Nothing in the keep yet'}>
          {anyFilter ? <p>Try fewer filters.</p> : null}
        </EmptyState>
      ) : (
        <>
          <div
            className={cx('overflow-x-auto rounded-lg border border-rule bg-paper-raised', isFetching && 'opacity-70')}
          >
            <table className="w-full text-left">
              <caption className="sr-only">Your cultures, {data.total} in all</caption>
              <thead className="border-b border-rule bg-paper-sunk/60 text-sm">
                {table.getHeaderGroups().map((hg) => (
                  <tr key={hg.id}>
                    {hg.headers.map((h) => {
                      const sorted = h.column.getIsSorted();
                      const wide = (h.column.columnDef.meta as { wide?: boolean } | undefined)?.wide;
                      return (
                        <th
                          key={h.id}
                          scope="col"
                          aria-sort={sorted ? (sorted === 'desc' ? 'descending' : 'ascending') : undefined}
                          className={cx('px-3 py-2 font-medium whitespace-nowrap', wide && 'hidden md:table-cell')}
                        >
                          <button
                            type="button"
                            onClick={h.column.getToggleSortingHandler()}
                            className="inline-flex min-h-9 items-center gap-1 hover:text-accent"
                          >
                            {flexRender(h.column.columnDef.header, h.getContext())}
                            {sorted === 'asc' ? (
                              <ArrowUp aria-hidden className="size-3.5" />
                            ) : sorted === 'desc' ? (
                              <ArrowDown aria-hidden className="size-3.5" />
                            ) : (
                              <ArrowUpDown aria-hidden className="size-3.5 text-ink-faint" />
                            )}
                          </button>
                        </th>
                      );
                    })}
                  </tr>
                ))}
              </thead>
              <tbody>
                {table.getRowModel().rows.map((row) => (
                  <tr key={row.id} className="border-b border-rule last:border-0">
                    {row.getVisibleCells().map((cell) => {
                      const wide = (cell.column.columnDef.meta as { wide?: boolean } | undefined)?.wide;
                      return (
                        <td key={cell.id} className={cx('px-3 py-2 align-top', wide && 'hidden md:table-cell')}>
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </td>
                      );
                    })}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <p className="text-sm text-ink-muted">* projected from the form and age, not measured.</p>
          <nav aria-label="Pages" className="flex items-center justify-between gap-3">
            <Button
              variant="secondary"
              disabled={filters.page! <= 1}
              onClick={() => update({ page: String(filters.page! - 1) })}
            >
              Previous
            </Button>
            <span className="text-sm text-ink-muted">
              Page <span className="num">{filters.page}</span> of <span className="num">{pages}</span> ·{' '}
              <span className="num">{data.total}</span> cultures
            </span>
            <Button
              variant="secondary"
              disabled={filters.page! >= pages}
              onClick={() => update({ page: String(filters.page! + 1) })}
            >
              Next
            </Button>
          </nav>
        </>
      )}
      <ExportAndBackup />
    </div>
  );
}

export function Component() {
  return (
    <>
      <title>Culture library · Barmkeep</title>
      <PageHeader
        title="Culture library"
        description="Everything you keep, the one that needs you soonest first."
        actions={
          <>
            <ButtonLink to="/cultures/new" icon={<Plus aria-hidden className="size-5" />}>
              Add a culture
            </ButtonLink>
          </>
        }
      />
      <CultureLibrary />
    </>
  );
}
