// The project's builds table: sortable, filterable, paginated (TanStack Table), with factor
// values in their units and the metric columns at the project's reference point.
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import {
  createColumnHelper, flexRender, getCoreRowModel, getFilteredRowModel, getPaginationRowModel, getSortedRowModel,
  useReactTable, type SortingState, type ColumnFiltersState,
} from '@tanstack/react-table';
import type { Build, FactorDef, ResponseDef, Project } from '@shared/api-types';
import { StatusBadge } from '@/components/ui/status-badge';
import { Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { METRICS, formatNumber, formatSignificant, massActivityLabel } from '@/lib/format';
import { buildEconomy } from '@shared/economy';
import type { BenchmarkView } from '@shared/schemas/benchmarks';
import { BenchmarkBadge, DifferenceToggle } from '@/components/ui/benchmark-badge';
import { differenceFromBenchmark, formatDifference } from '@/lib/benchmark-difference';

const column = createColumnHelper<Build>();
const METRIC_COLUMNS = ['vAtRef', 'vAtRefIrFree', 'massActivity', 'peakPower', 'hfr', 'tafelSlope', 'degradationRate'];

/** A metric in its display unit, or (with a benchmark) its signed difference from the benchmark's. */
function metricCell(key: string, value: number | null | undefined, benchmark: BenchmarkView | null) {
  const info = METRICS[key]!;
  if (value == null) return <span className="text-ink-500">—</span>;
  if (benchmark) {
    const diff = differenceFromBenchmark(benchmark, key, value);
    return <span className="num block text-right" title={`${formatNumber(value * info.scale, info.digits)} ${info.unit}`}>{formatDifference({ unit: '', scale: info.scale, digits: info.digits }, diff)}</span>;
  }
  return <span className="num block text-right">{formatNumber(value * info.scale, info.digits)}</span>;
}

/** A list too long for one answer: the table shows one page the server sent and asks for others. */
export interface ServerPages {
  page: number;
  pageCount: number;
  total: number;
  pageSize: number;
  onPage: (page: number) => void;
  loading: boolean;
}

export function BuildsTable({ project, builds, factors, responses, selected, onSelect, benchmark, serverPages }: {
  project: Project;
  builds: Build[];
  factors: FactorDef[];
  responses: ResponseDef[];
  selected?: Set<number>;
  onSelect?: (id: number, on: boolean) => void;
  /** the project's benchmark: its build is marked, and values can be shown as differences from it */
  benchmark?: BenchmarkView | null;
  /** set when the project's builds come a page at a time: sort and search act on the page shown */
  serverPages?: ServerPages;
}) {
  const [asDifference, setAsDifference] = useState(false);
  const diffFrom = asDifference && benchmark ? benchmark : null;
  const [sorting, setSorting] = useState<SortingState>([{ id: 'code', desc: false }]);
  const [globalFilter, setGlobalFilter] = useState('');
  const [columnFilters, setColumnFilters] = useState<ColumnFiltersState>([]);

  const columns = useMemo(() => {
    const cols = [
      ...(onSelect
        ? [column.display({
            id: 'select',
            header: () => <span className="sr-only">Select</span>,
            cell: (c) => (
              <input type="checkbox" aria-label={`Select ${c.row.original.code}`} checked={selected?.has(c.row.original.id) ?? false} onChange={(e) => onSelect(c.row.original.id, e.target.checked)} />
            ),
          })]
        : []),
      column.accessor('code', {
        header: 'Build',
        cell: (c) => (
          <span className="inline-flex items-center gap-2">
            <Link to={`/projects/${project.id}/builds/${c.row.original.id}`} className="font-medium text-copper-700 hover:underline">{c.getValue()}</Link>
            {benchmark?.kind === 'build' && benchmark.buildId === c.row.original.id && <BenchmarkBadge note={benchmark.note} />}
          </span>
        ),
      }),
      column.accessor('parentCode', { header: 'Parent', cell: (c) => c.getValue() ?? <span className="text-ink-500">—</span> }),
      column.accessor('changeNote', { header: 'Change', cell: (c) => <span className="block max-w-[16rem] truncate" title={c.getValue() ?? ''}>{c.getValue() ?? ''}</span> }),
      column.accessor('status', { header: 'Status', cell: (c) => <StatusBadge status={c.getValue()} />, filterFn: 'equalsString' }),
      ...METRIC_COLUMNS.map((key) =>
        column.accessor((b) => b.values[key] ?? null, {
          id: `m_${key}`,
          header: () => (
            <span title={`${METRICS[key]!.description}${key === 'vAtRef' ? ` at ${project.settings.refCurrentDensity} A/cm²` : ''}`}>
              {diffFrom ? 'Δ ' : ''}{key === 'massActivity' ? massActivityLabel(project.settings) : METRICS[key]!.label} <span className="font-normal text-ink-500">({METRICS[key]!.unit})</span>
            </span>
          ),
          cell: (c) => metricCell(key, c.getValue(), diffFrom),
          sortUndefined: 'last',
        }),
      ),
      column.accessor((b) => buildEconomy(b, project.settings).gPerKw, {
        id: 'e_gPerKw',
        header: () => <span title="g of precious metal per kW: measured metal loading ÷ power density at V_ref (else at peak power)">Precious metal <span className="font-normal text-ink-500">(g/kW)</span></span>,
        cell: (c) => {
          const e = buildEconomy(c.row.original, project.settings);
          if (e.gPerKw == null) return <span className="text-ink-500" title={e.loadingNote ?? e.powerNote ?? undefined}>—</span>;
          return <span className="num block text-right" title={`${e.method.gPerKw}; ${formatNumber(e.metalLoadingMgCm2, 3)} mg/cm² ${e.powerLabel ?? ''}`}>{formatSignificant(e.gPerKw, 3)}</span>;
        },
        sortUndefined: 'last',
      }),
      column.accessor((b) => buildEconomy(b, project.settings).costPerKw, {
        id: 'e_cost',
        header: () => <span title="cost per kW of the precious metal, from the price the project recorded">Metal cost <span className="font-normal text-ink-500">(per kW)</span></span>,
        cell: (c) => {
          const e = buildEconomy(c.row.original, project.settings);
          if (e.costPerKw == null) return <span className="text-ink-500" title={e.costNote ?? undefined}>—</span>;
          return <span className="num block whitespace-nowrap text-right" title={`${e.method.cost}; price of ${e.priceDate}, ${e.priceSource}`}>{formatNumber(e.costPerKw, 1)} {e.costUnit}</span>;
        },
        sortUndefined: 'last',
      }),
      ...factors.map((f) =>
        column.accessor((b) => b.factors[f.key] ?? null, {
          id: `f_${f.key}`,
          header: () => <span title={f.label}>{f.label}{f.unit ? <span className="font-normal text-ink-500"> ({f.unit})</span> : null}</span>,
          cell: (c) => {
            const v = c.getValue();
            if (v == null) return <span className="text-ink-500">—</span>;
            return typeof v === 'number' ? <span className="num">{v}</span> : <span>{v}</span>;
          },
          sortUndefined: 'last',
        }),
      ),
      column.accessor('labName', { header: 'Lab', cell: (c) => <span className="whitespace-nowrap">{c.getValue() ?? '—'}</span>, filterFn: 'equalsString' }),
      ...responses.map((r) =>
        column.accessor((b) => b.values[r.key] ?? null, {
          id: `r_${r.key}`,
          header: () => <span>{diffFrom ? 'Δ ' : ''}{r.label}{r.unit ? <span className="font-normal text-ink-500"> ({r.unit})</span> : null}</span>,
          cell: (c) => {
            const v = c.getValue();
            if (v == null) return <span className="text-ink-500">—</span>;
            if (diffFrom) return <span className="num" title={formatNumber(v, 2)}>{formatDifference({ unit: '', scale: 1, digits: 2 }, differenceFromBenchmark(diffFrom, r.key, v))}</span>;
            return <span className="num">{formatNumber(v, 2)}</span>;
          },
          sortUndefined: 'last',
        }),
      ),
    ];
    return cols;
  }, [factors, responses, project, selected, onSelect, benchmark, diffFrom]);

  const table = useReactTable({
    data: builds,
    columns,
    state: { sorting, globalFilter, columnFilters },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    onColumnFiltersChange: setColumnFilters,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    globalFilterFn: (row, _id, value: string) => {
      const b = row.original;
      const hay = `${b.code} ${b.parentCode ?? ''} ${b.changeNote ?? ''} ${b.labName ?? ''} ${b.catalystLot ?? ''} ${Object.values(b.factors).join(' ')}`.toLowerCase();
      return hay.includes(value.toLowerCase());
    },
    initialState: { pagination: { pageSize: serverPages ? serverPages.pageSize : 25 } },
  });

  const labs = [...new Set(builds.map((b) => b.labName).filter(Boolean))] as string[];
  const setFilter = (id: string, value: string) => setColumnFilters((f) => [...f.filter((x) => x.id !== id), ...(value ? [{ id, value }] : [])]);
  const filtered = table.getFilteredRowModel().rows.length;

  return (
    <div>
      <div className="mb-3 flex flex-wrap items-end gap-2">
        <div className="w-64">
          <label htmlFor="build-search" className="sr-only">Search builds</label>
          <Input id="build-search" placeholder="Search code, change, lot, factor…" value={globalFilter} onChange={(e) => setGlobalFilter(e.target.value)} />
        </div>
        <div className="w-40">
          <label htmlFor="status-filter" className="sr-only">Status</label>
          <Select id="status-filter" value={(columnFilters.find((f) => f.id === 'status')?.value as string) ?? ''} onChange={(e) => setFilter('status', e.target.value)}>
            <option value="">All statuses</option>
            {['planned', 'built', 'tested', 'reviewed', 'discarded'].map((s) => <option key={s} value={s}>{s}</option>)}
          </Select>
        </div>
        <div className="w-56">
          <label htmlFor="lab-filter" className="sr-only">Lab</label>
          <Select id="lab-filter" value={(columnFilters.find((f) => f.id === 'labName')?.value as string) ?? ''} onChange={(e) => setFilter('labName', e.target.value)}>
            <option value="">All labs</option>
            {labs.map((l) => <option key={l} value={l}>{l}</option>)}
          </Select>
        </div>
        <DifferenceToggle benchmark={benchmark} checked={asDifference} onChange={setAsDifference} />
        <span className="ml-auto text-xs text-ink-500">
          {serverPages ? `${serverPages.page * serverPages.pageSize + 1}–${serverPages.page * serverPages.pageSize + builds.length} of ${serverPages.total.toLocaleString('en-GB')} builds (search and sort act on this page)` : `${filtered} of ${builds.length} builds`} · metrics at j_ref = {project.settings.refCurrentDensity} A/cm², V_ref = {project.settings.refVoltage} V{project.settings.irFree ? ' (iR-free)' : ''}
        </span>
      </div>
      <div className="overflow-x-auto rounded-lg border border-line bg-panel">
        <table className="w-full text-sm" aria-label="Builds">
          <thead className="border-b border-line bg-paper/60 text-left text-xs text-ink-700">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sort = h.column.getIsSorted();
                  return (
                    <th key={h.id} className="whitespace-nowrap px-3 py-2 font-semibold" aria-sort={sort === 'asc' ? 'ascending' : sort === 'desc' ? 'descending' : undefined}>
                      {h.column.getCanSort() ? (
                        <button type="button" className="inline-flex items-center gap-1 hover:text-ink-950" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden className="text-ink-300">{sort === 'asc' ? '▲' : sort === 'desc' ? '▼' : '↕'}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-line">
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className={`hover:bg-paper/70 ${row.original.status === 'discarded' ? 'bg-paper/60 text-ink-500' : ''}`}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="whitespace-nowrap px-3 py-1.5 text-ink-900">{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>
                ))}
              </tr>
            ))}
            {table.getRowModel().rows.length === 0 && (
              <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-ink-500">No builds match these filters.</td></tr>
            )}
          </tbody>
        </table>
      </div>
      {serverPages ? (
        <div className="mt-2 flex items-center justify-end gap-2 text-sm text-ink-700">
          <span aria-live="polite">Page {serverPages.page + 1} of {serverPages.pageCount}{serverPages.loading ? ' · loading…' : ''}</span>
          <Button onClick={() => serverPages.onPage(serverPages.page - 1)} disabled={serverPages.page === 0 || serverPages.loading}>Previous</Button>
          <Button onClick={() => serverPages.onPage(serverPages.page + 1)} disabled={serverPages.page + 1 >= serverPages.pageCount || serverPages.loading}>Next</Button>
        </div>
      ) : (
      <div className="mt-2 flex items-center justify-end gap-2 text-sm text-ink-700">
        <span>Page {table.getState().pagination.pageIndex + 1} of {Math.max(1, table.getPageCount())}</span>
        <Button onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>Previous</Button>
        <Button onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>Next</Button>
        <label htmlFor="page-size" className="sr-only">Rows per page</label>
        <Select id="page-size" className="w-24" value={table.getState().pagination.pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
          {[10, 25, 50, 100].map((n) => <option key={n} value={n}>{n} rows</option>)}
        </Select>
      </div>
      )}
    </div>
  );
}
