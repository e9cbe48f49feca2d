// The reports list: filters in the URL, a sortable table (@tanstack/react-table)
// of what GET /api/reports answers for the caller, and a CSV export of the
// same view.
import { useEffect, useMemo, useState } from 'react';
import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';

interface Item {
  id: number;
  label: string;
  title: string;
  status: 'draft' | 'submitted' | 'approved' | 'returned';
  conclusion: 'identified' | 'tentative' | 'not_in_library' | null;
  author: { id: string; name: string } | null;
  reviewer: { id: string; name: string } | null;
  selected: { recordId: number; version: number; name: string | null } | null;
  supersedesReportId: number | null;
  createdAt: string;
  updatedAt: string;
  submittedAt: string | null;
  decidedAt: string | null;
}

const STATUS: Record<Item['status'], { label: string; tone: string }> = {
  draft: { label: 'Draft', tone: 'bg-paper text-ink-soft border-line' },
  submitted: { label: 'Submitted', tone: 'bg-copper-soft text-copper border-copper/40' },
  returned: { label: 'Returned', tone: 'bg-alert-soft text-alert border-alert/40' },
  approved: { label: 'Approved', tone: 'bg-teal-soft text-teal border-teal/40' },
};
const CONCLUSION: Record<string, string> = { identified: 'Identified', tentative: 'Tentative', not_in_library: 'Not in library' };

const when = (s: string | null) => (s ? new Date(s).toISOString().slice(0, 16).replace('T', ' ') + ' UTC' : '—');

const FILTER_KEYS = ['status', 'conclusion', 'q', 'author', 'reviewer', 'from', 'to', 'mine'] as const;
type Filters = Record<(typeof FILTER_KEYS)[number], string>;

function readFilters(): Filters {
  const p = new URLSearchParams(typeof location === 'undefined' ? '' : location.search);
  return Object.fromEntries(FILTER_KEYS.map((k) => [k, p.get(k) ?? ''])) as Filters;
}

function toQuery(f: Filters): string {
  const p = new URLSearchParams();
  for (const k of FILTER_KEYS) if (f[k]) p.set(k, f[k]);
  return p.toString();
}

const col = createColumnHelper<Item>();

export default function ReportsTable({ canWrite }: { canWrite: boolean }) {
  const [filters, setFilters] = useState<Filters>(readFilters);
  const [items, setItems] = useState<Item[] | null>(null);
  const [total, setTotal] = useState(0);
  const [error, setError] = useState<string | null>(null);
  const [sorting, setSorting] = useState<SortingState>([]);

  useEffect(() => {
    const qs = toQuery(filters);
    history.replaceState(null, '', qs ? `?${qs}` : location.pathname);
    const ctl = new AbortController();
    setError(null);
    fetch(`/api/reports?${qs}`, { signal: ctl.signal, headers: { accept: 'application/json' } })
      .then(async (r) => {
        const body = await r.json();
        if (!r.ok) throw new Error(body?.error?.message ?? `HTTP ${r.status}`);
        setItems(body.items);
        setTotal(body.total);
      })
      .catch((e) => {
        if ((e as Error).name !== 'AbortError') setError((e as Error).message);
      });
    return () => ctl.abort();
  }, [filters]);

  const columns = useMemo(() => [
    col.accessor('label', { header: 'Report', cell: (c) => <a href={`/reports/${c.row.original.id}`} className="font-semibold">{c.getValue()}</a> }),
    col.accessor('title', { header: 'Title', cell: (c) => <a href={`/reports/${c.row.original.id}`}>{c.getValue()}</a> }),
    col.accessor('status', { header: 'Status', cell: (c) => <span className={`badge border ${STATUS[c.getValue()].tone}`}>{STATUS[c.getValue()].label}</span> }),
    col.accessor((r) => (r.conclusion ? CONCLUSION[r.conclusion] : ''), { id: 'conclusion', header: 'Conclusion', cell: (c) => c.getValue() || '—' }),
    col.accessor((r) => r.selected?.name ?? '', { id: 'selected', header: 'Selected hit', cell: (c) => (c.row.original.selected ? `${c.getValue() || 'record'} (#${c.row.original.selected.recordId} v${c.row.original.selected.version})` : '—') }),
    col.accessor((r) => r.author?.name ?? '', { id: 'author', header: 'Author' }),
    col.accessor((r) => r.reviewer?.name ?? '', { id: 'reviewer', header: 'Reviewer', cell: (c) => c.getValue() || '—' }),
    col.accessor('createdAt', { header: 'Created', cell: (c) => when(c.getValue()) }),
    col.accessor('submittedAt', { header: 'Submitted', cell: (c) => when(c.getValue()) }),
    col.accessor('decidedAt', { header: 'Decided', cell: (c) => when(c.getValue()) }),
  ], []);

  const table = useReactTable({ data: items ?? [], columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  const set = (k: keyof Filters) => (e: { target: { value: string } }) => setFilters((f) => ({ ...f, [k]: e.target.value }));

  return (
    <div>
      <form className="card grid gap-3 md:grid-cols-4 lg:grid-cols-8" onSubmit={(e) => e.preventDefault()} data-testid="report-filters">
        <label className="lg:col-span-2"><span className="label">Title or report id</span><input className="field" value={filters.q} onChange={set('q')} placeholder="e.g. IR-00012" /></label>
        <label><span className="label">Status</span>
          <select className="field" value={filters.status} onChange={set('status')} name="status">
            <option value="">any</option>
            {Object.entries(STATUS).map(([k, v]) => <option key={k} value={k}>{v.label}</option>)}
          </select>
        </label>
        <label><span className="label">Conclusion</span>
          <select className="field" value={filters.conclusion} onChange={set('conclusion')}>
            <option value="">any</option>
            {Object.entries(CONCLUSION).map(([k, v]) => <option key={k} value={k}>{v}</option>)}
          </select>
        </label>
        <label><span className="label">Author</span><input className="field" value={filters.author} onChange={set('author')} /></label>
        <label><span className="label">Reviewer</span><input className="field" value={filters.reviewer} onChange={set('reviewer')} /></label>
        <label><span className="label">Created from</span><input type="date" className="field" value={filters.from} onChange={set('from')} /></label>
        <label><span className="label">Created to</span><input type="date" className="field" value={filters.to} onChange={set('to')} /></label>
        {canWrite && (
          <label className="flex items-center gap-2 text-sm md:col-span-2"><input type="checkbox" checked={filters.mine === '1'} onChange={(e) => setFilters((f) => ({ ...f, mine: e.target.checked ? '1' : '' }))} /> Only my reports</label>
        )}
      </form>
      <div className="mt-4 flex flex-wrap items-center gap-3">
        <p className="text-sm text-muted" aria-live="polite">{items === null ? 'Loading…' : `${total} report${total === 1 ? '' : 's'}`}</p>
        <a className="btn-quiet ml-auto no-underline" href={`/api/reports?${toQuery(filters)}${toQuery(filters) ? '&' : ''}format=csv`} data-testid="reports-csv">Export CSV</a>
      </div>
      {error && <p role="alert" className="mt-3 rounded-md bg-alert-soft px-3 py-2 text-alert">{error}</p>}
      <div className="mt-3 overflow-x-auto">
        <table className="data-table bg-panel" data-testid="reports-table">
          <thead>
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => (
                  <th key={h.id} aria-sort={h.column.getIsSorted() === 'asc' ? 'ascending' : h.column.getIsSorted() === 'desc' ? 'descending' : 'none'}>
                    <button type="button" className="font-semibold" onClick={h.column.getToggleSortingHandler()}>
                      {flexRender(h.column.columnDef.header, h.getContext())}
                      {h.column.getIsSorted() === 'asc' ? ' ↑' : h.column.getIsSorted() === 'desc' ? ' ↓' : ''}
                    </button>
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} data-report-id={r.original.id}>
                {r.getVisibleCells().map((c) => <td key={c.id}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
              </tr>
            ))}
            {items && items.length === 0 && (
              <tr><td colSpan={columns.length} className="text-muted">No report matches these filters.</td></tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
