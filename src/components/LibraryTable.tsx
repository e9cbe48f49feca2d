// The Library browser: a server-paged, server-sorted, server-filtered table of
// records (GET /api/spectra), with the view kept in the URL, a column chooser,
// CSV export of the view and bulk tagging for curators.
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type RowSelectionState,
  type SortingState,
  type VisibilityState,
} from '@tanstack/react-table';
import { activeFilterCount, apiSearch, EMPTY_FILTERS, PAGE_SIZES, pageSearch, viewFromSearch, type LibraryFilters, type LibraryView } from './libraryQuery';

export interface LibraryItem {
  id: number;
  version: number;
  name: string;
  synonyms?: string[];
  formula: string | null;
  nominalMass: number | null;
  ihd: number | null;
  casRegistryNo?: string | null;
  tags: string[];
  status: string;
  peakCount: number;
  basePeak: number | null;
  synthetic: boolean;
  updatedAt?: string;
  matchedSynonym?: string;
}

interface ListAnswer {
  items: LibraryItem[];
  total: number;
}

interface Props {
  initialSearch: string;
  initial: ListAnswer | null;
  initialError: string | null;
  canCurate: boolean;
  canSeeDrafts: boolean;
  canSearch: boolean;
  tagNames: string[];
}

const DEFAULT_HIDDEN = ['casRegistryNo', 'peakCount', 'version', 'updatedAt'];
const STATUS_LABEL: Record<string, string> = {
  draft: 'draft', in_review: 'in review', released: 'released', superseded: 'superseded', retired: 'retired',
};
/** Column id -> the API's sort key. */
const SORTABLE: Record<string, string> = {
  name: 'name', formula: 'formula', nominalMass: 'nominalMass', ihd: 'ihd', peakCount: 'peakCount', basePeak: 'basePeak', status: 'status', updatedAt: 'updatedAt',
};

async function errorText(res: Response): Promise<string> {
  const body = await res.json().catch(() => null);
  const msg = body?.error?.message;
  if (res.status === 401) return 'Your session has ended. Sign in again to go on.';
  if (res.status === 403) return msg ?? 'Your roles do not allow this.';
  if (res.status === 503) return 'The database is not reachable right now; try again shortly.';
  return msg ? `${msg}` : `The server answered ${res.status}.`;
}

function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

export default function LibraryTable({ initialSearch, initial, initialError, canCurate, canSeeDrafts, canSearch, tagNames }: Props) {
  const [view, setView] = useState<LibraryView>(() => viewFromSearch(initialSearch));
  const [data, setData] = useState<ListAnswer | null>(initial);
  const [error, setError] = useState<string | null>(initialError);
  const [loading, setLoading] = useState(initial === null && initialError === null);
  const [selection, setSelection] = useState<RowSelectionState>({});
  const [tagText, setTagText] = useState('');
  const [tagMessage, setTagMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [tagBusy, setTagBusy] = useState(false);
  const [refresh, setRefresh] = useState(0);
  const first = useRef(true);

  const debouncedFilters = useDebounced(view.filters, 300);
  const query = useMemo(() => apiSearch({ ...view, filters: debouncedFilters }).toString(), [debouncedFilters, view.page, view.pageSize, view.sort]);

  useEffect(() => {
    const search = pageSearch(view);
    if (search !== window.location.search) window.history.replaceState(null, '', `${window.location.pathname}${search}`);
  }, [view]);

  useEffect(() => {
    if (first.current && (initial || initialError)) {
      first.current = false;
      return;
    }
    first.current = false;
    const ctl = new AbortController();
    setLoading(true);
    fetch(`/api/spectra?${query}`, { signal: ctl.signal, headers: { accept: 'application/json' } })
      .then(async (res) => {
        if (!res.ok) throw new Error(await errorText(res));
        const body = (await res.json()) as ListAnswer;
        setData(body);
        setError(null);
      })
      .catch((e) => {
        if ((e as Error).name !== 'AbortError') setError((e as Error).message === 'Failed to fetch' ? 'The server could not be reached.' : (e as Error).message);
      })
      .finally(() => {
        if (!ctl.signal.aborted) setLoading(false);
      });
    return () => ctl.abort();
  }, [query, refresh]);

  const setFilter = useCallback((key: keyof LibraryFilters, value: string) => {
    setView((v) => ({ ...v, page: 1, filters: { ...v.filters, [key]: value } }));
  }, []);

  const columns = useMemo<ColumnDef<LibraryItem>[]>(() => {
    const cols: ColumnDef<LibraryItem>[] = [];
    if (canCurate) {
      cols.push({
        id: 'select',
        enableHiding: false,
        header: ({ table }) => (
          <input
            type="checkbox"
            aria-label="Select every record on this page"
            checked={table.getIsAllPageRowsSelected()}
            ref={(el) => {
              if (el) el.indeterminate = table.getIsSomePageRowsSelected();
            }}
            onChange={table.getToggleAllPageRowsSelectedHandler()}
          />
        ),
        cell: ({ row }) => (
          <input type="checkbox" aria-label={`Select ${row.original.name}`} checked={row.getIsSelected()} onChange={row.getToggleSelectedHandler()} />
        ),
      });
    }
    cols.push(
      {
        id: 'name',
        header: 'Name',
        enableHiding: false,
        cell: ({ row }) => (
          <div>
            <a href={`/library/${row.original.id}${row.original.status !== 'released' ? `?version=${row.original.version}` : ''}`} className="font-semibold" data-testid="record-link">
              {row.original.name}
            </a>
            {row.original.synthetic && <span className="badge-synthetic ml-2 align-middle">synthetic demo</span>}
            {row.original.matchedSynonym && <div className="text-xs text-muted">matched “{row.original.matchedSynonym}”</div>}
          </div>
        ),
      },
      { id: 'formula', header: 'Formula', cell: ({ row }) => <span className="font-mono text-sm">{row.original.formula ?? '—'}</span> },
      { id: 'nominalMass', header: 'Nominal mass', cell: ({ row }) => row.original.nominalMass ?? '—' },
      { id: 'ihd', header: 'IHD', cell: ({ row }) => (row.original.ihd === null ? '—' : row.original.ihd) },
      { id: 'basePeak', header: 'Base peak m/z', cell: ({ row }) => (row.original.basePeak === null ? '—' : Math.round(row.original.basePeak * 100) / 100) },
      { id: 'peakCount', header: 'Peaks', cell: ({ row }) => row.original.peakCount },
      {
        id: 'tags',
        header: 'Tags',
        cell: ({ row }) => (
          <div className="flex flex-wrap gap-1">
            {row.original.tags.map((t) => (
              <button
                key={t}
                type="button"
                className="rounded bg-teal-soft px-1.5 py-0.5 text-xs text-ink hover:bg-teal hover:text-white"
                title={`Show only records tagged ${t}`}
                onClick={() => setFilter('tags', t)}
              >
                {t}
              </button>
            ))}
          </div>
        ),
      },
      { id: 'status', header: 'Status', cell: ({ row }) => <StatusPill status={row.original.status} /> },
      { id: 'version', header: 'Version', cell: ({ row }) => row.original.version },
      { id: 'casRegistryNo', header: 'CAS RN', cell: ({ row }) => row.original.casRegistryNo ?? '—' },
      { id: 'updatedAt', header: 'Updated', cell: ({ row }) => (row.original.updatedAt ? row.original.updatedAt.slice(0, 10) : '—') },
    );
    return cols;
  }, [canCurate, setFilter]);

  const sorting: SortingState = view.sort
    ? [{ id: view.sort.replace(/^-/, ''), desc: view.sort.startsWith('-') }]
    : [];
  const hidden = view.hidden ?? DEFAULT_HIDDEN;
  const columnVisibility: VisibilityState = Object.fromEntries(hidden.map((h) => [h, false]));
  const total = data?.total ?? 0;
  const pageCount = Math.max(1, Math.ceil(total / view.pageSize));

  const table = useReactTable({
    data: data?.items ?? [],
    columns,
    getRowId: (r) => String(r.id),
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    enableRowSelection: canCurate,
    pageCount,
    state: { sorting, columnVisibility, rowSelection: selection, pagination: { pageIndex: view.page - 1, pageSize: view.pageSize } },
    onRowSelectionChange: setSelection,
    onColumnVisibilityChange: (updater) => {
      const next = typeof updater === 'function' ? updater(columnVisibility) : updater;
      setView((v) => ({ ...v, hidden: Object.entries(next).filter(([, on]) => !on).map(([id]) => id) }));
    },
  });

  function toggleSort(id: string) {
    const key = SORTABLE[id];
    if (!key) return;
    setView((v) => {
      const current = v.sort.replace(/^-/, '');
      const desc = v.sort.startsWith('-');
      const sort = current !== key ? key : desc ? '' : `-${key}`;
      return { ...v, sort, page: 1 };
    });
  }

  const selectedIds = Object.keys(selection).filter((k) => selection[k]).map(Number);

  async function assignTags(action: 'add' | 'remove') {
    const tagNamesToSend = tagText.split(',').map((t) => t.trim()).filter(Boolean);
    if (tagNamesToSend.length === 0) {
      setTagMessage({ ok: false, text: 'Type one or more tag names, separated by commas.' });
      return;
    }
    setTagBusy(true);
    setTagMessage(null);
    try {
      const res = await fetch('/api/tags/assign', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ recordIds: selectedIds, tagNames: tagNamesToSend, action }),
      });
      if (!res.ok) {
        setTagMessage({ ok: false, text: res.status === 404 ? 'Bulk tagging is not available on this server yet.' : await errorText(res) });
        return;
      }
      setTagMessage({
        ok: true,
        text: `${action === 'add' ? 'Added' : 'Removed'} ${tagNamesToSend.join(', ')} ${action === 'add' ? 'to' : 'from'} ${selectedIds.length} record${selectedIds.length === 1 ? '' : 's'}.`,
      });
      setSelection({});
      setRefresh((n) => n + 1);
    } catch {
      setTagMessage({ ok: false, text: 'The server could not be reached.' });
    } finally {
      setTagBusy(false);
    }
  }

  const filterCount = activeFilterCount(view.filters);
  const exportHref = `/api/spectra/export.csv?${(() => {
    const p = apiSearch({ ...view, page: 1 });
    p.delete('page');
    p.delete('pageSize');
    return p.toString();
  })()}`;
  const f = view.filters;

  return (
    <div className="grid gap-5 lg:grid-cols-[17rem_minmax(0,1fr)]" data-testid="library">
      <form className="card space-y-3 self-start" role="search" aria-label="Filter the library" onSubmit={(e) => e.preventDefault()}>
        <div>
          <label className="label" htmlFor="lib-q">Name or synonym</label>
          <input id="lib-q" className="field" type="search" placeholder="e.g. toluene" value={f.q} onChange={(e) => setFilter('q', e.target.value)} autoComplete="off" />
          <p className="mt-1 text-xs text-muted">Spelling mistakes are tolerated; a CAS RN finds that number.</p>
        </div>
        <div>
          <label className="label" htmlFor="lib-formula">Formula</label>
          <input id="lib-formula" className="field font-mono" placeholder="C7H8" value={f.formula} onChange={(e) => setFilter('formula', e.target.value)} />
        </div>
        <div className="grid grid-cols-2 gap-2">
          <div>
            <label className="label" htmlFor="lib-elements">Contains</label>
            <input id="lib-elements" className="field" placeholder="Cl,Br" value={f.elements} onChange={(e) => setFilter('elements', e.target.value)} />
          </div>
          <div>
            <label className="label" htmlFor="lib-exclude">Lacks</label>
            <input id="lib-exclude" className="field" placeholder="N,S" value={f.excludeElements} onChange={(e) => setFilter('excludeElements', e.target.value)} />
          </div>
        </div>
        <fieldset className="grid grid-cols-2 gap-2">
          <legend className="label">IHD from / to</legend>
          <label className="sr-only" htmlFor="lib-ihdmin">IHD from</label>
          <input id="lib-ihdmin" className="field" inputMode="decimal" placeholder="min" value={f.ihdMin} onChange={(e) => setFilter('ihdMin', e.target.value)} />
          <label className="sr-only" htmlFor="lib-ihdmax">IHD to</label>
          <input id="lib-ihdmax" className="field" inputMode="decimal" placeholder="max" value={f.ihdMax} onChange={(e) => setFilter('ihdMax', e.target.value)} />
        </fieldset>
        <fieldset className="grid grid-cols-2 gap-2">
          <legend className="label">Nominal mass from / to</legend>
          <label className="sr-only" htmlFor="lib-massmin">Nominal mass from</label>
          <input id="lib-massmin" className="field" inputMode="numeric" placeholder="min" value={f.massMin} onChange={(e) => setFilter('massMin', e.target.value)} />
          <label className="sr-only" htmlFor="lib-massmax">Nominal mass to</label>
          <input id="lib-massmax" className="field" inputMode="numeric" placeholder="max" value={f.massMax} onChange={(e) => setFilter('massMax', e.target.value)} />
        </fieldset>
        <div>
          <label className="label" htmlFor="lib-tags">Tags (all of)</label>
          <input id="lib-tags" className="field" list="lib-tag-names" placeholder="solvent" value={f.tags} onChange={(e) => setFilter('tags', e.target.value)} />
          <datalist id="lib-tag-names">
            {tagNames.map((t) => <option key={t} value={t} />)}
          </datalist>
        </div>
        {canSeeDrafts && (
          <fieldset>
            <legend className="label">Status</legend>
            <div className="flex flex-wrap gap-x-3 gap-y-1 text-sm">
              {Object.entries(STATUS_LABEL).map(([value, label]) => {
                const set = f.status.split(',').filter(Boolean);
                const on = set.includes(value);
                return (
                  <label key={value} className="inline-flex items-center gap-1">
                    <input
                      type="checkbox"
                      checked={on}
                      onChange={() => setFilter('status', (on ? set.filter((s) => s !== value) : [...set, value]).join(','))}
                    />
                    {label}
                  </label>
                );
              })}
            </div>
            <p className="mt-1 text-xs text-muted">None ticked: released versions only.</p>
          </fieldset>
        )}
        <button type="button" className="btn-quiet w-full justify-center" disabled={filterCount === 0} onClick={() => setView((v) => ({ ...v, page: 1, filters: { ...EMPTY_FILTERS } }))}>
          Clear filters{filterCount > 0 ? ` (${filterCount})` : ''}
        </button>
      </form>

      <section aria-label="Records" className="min-w-0 space-y-3">
        <div className="flex flex-wrap items-center gap-3">
          <p className="mr-auto text-sm text-muted" aria-live="polite" data-testid="library-total">
            {loading ? 'Loading…' : `${total} record${total === 1 ? '' : 's'}`}
            {filterCount > 0 && !loading ? ` match ${filterCount} filter${filterCount === 1 ? '' : 's'}` : ''}
          </p>
          <details className="relative">
            <summary className="btn-quiet cursor-pointer list-none text-sm">Columns</summary>
            <div className="absolute right-0 z-10 mt-1 w-52 rounded-md border border-line bg-panel p-3 shadow-lg">
              {table.getAllLeafColumns().filter((c) => c.getCanHide()).map((c) => (
                <label key={c.id} className="flex items-center gap-2 py-0.5 text-sm">
                  <input type="checkbox" checked={c.getIsVisible()} onChange={c.getToggleVisibilityHandler()} />
                  {String(c.columnDef.header)}
                </label>
              ))}
              <button type="button" className="mt-2 text-xs text-teal underline" onClick={() => setView((v) => ({ ...v, hidden: null }))}>Back to the default columns</button>
            </div>
          </details>
          <a className="btn-quiet text-sm no-underline" href={exportHref} download data-testid="export-csv">Export view as CSV</a>
        </div>

        {canCurate && selectedIds.length > 0 && (
          <div className="flex flex-wrap items-end gap-2 rounded-md border border-teal bg-teal-soft p-3" data-testid="bulk-tagging">
            <p className="w-full text-sm font-semibold">{selectedIds.length} record{selectedIds.length === 1 ? '' : 's'} selected</p>
            <div className="min-w-48 flex-1">
              <label className="label" htmlFor="bulk-tags">Tag names (comma-separated)</label>
              <input id="bulk-tags" className="field" list="lib-tag-names" value={tagText} onChange={(e) => setTagText(e.target.value)} />
            </div>
            <button type="button" className="btn-primary" disabled={tagBusy} onClick={() => assignTags('add')}>Add tags</button>
            <button type="button" className="btn-quiet" disabled={tagBusy} onClick={() => assignTags('remove')}>Remove tags</button>
            <button type="button" className="btn-quiet" onClick={() => setSelection({})}>Clear selection</button>
          </div>
        )}
        {tagMessage && (
          <p role={tagMessage.ok ? 'status' : 'alert'} className={tagMessage.ok ? 'text-sm text-moss' : 'rounded-md bg-alert-soft px-3 py-2 text-sm text-alert'}>{tagMessage.text}</p>
        )}

        {error && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert" data-testid="library-error">{error}</p>}

        <div className="overflow-x-auto rounded-lg border border-line bg-panel">
          <table className="data-table" data-testid="library-table">
            <thead>
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((h) => {
                    const sortKey = SORTABLE[h.column.id];
                    const state = sorting.find((s) => s.id === sortKey);
                    return (
                      <th key={h.id} scope="col" aria-sort={state ? (state.desc ? 'descending' : 'ascending') : undefined}>
                        {sortKey ? (
                          <button type="button" className="inline-flex items-center gap-1 font-semibold" onClick={() => toggleSort(h.column.id)} title="Sort by this column">
                            {flexRender(h.column.columnDef.header, h.getContext())}
                            <span aria-hidden="true" className="text-xs text-muted">{state ? (state.desc ? '▼' : '▲') : '↕'}</span>
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
            <tbody>
              {loading && !data
                ? Array.from({ length: 8 }, (_, i) => (
                    <tr key={i}>
                      {table.getVisibleLeafColumns().map((c) => (
                        <td key={c.id}><div className="skeleton h-4 w-full" /></td>
                      ))}
                    </tr>
                  ))
                : table.getRowModel().rows.map((row) => (
                    <tr key={row.id} className={loading ? 'opacity-50' : 'hover:bg-paper'} data-testid="library-row">
                      {row.getVisibleCells().map((cell) => (
                        <td key={cell.id}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>
                      ))}
                    </tr>
                  ))}
            </tbody>
          </table>
          {!loading && data && data.items.length === 0 && !error && (
            <div className="p-6 text-center" data-testid="library-empty">
              <p className="font-semibold">No record matches this view.</p>
              <p className="mt-1 text-sm text-muted">
                {filterCount > 0 ? 'Loosen a filter — widen the mass or IHD range, drop a tag or an element — or ' : 'The library has no released records yet. '}
                {filterCount > 0 && (
                  <button type="button" className="text-teal underline" onClick={() => setView((v) => ({ ...v, page: 1, filters: { ...EMPTY_FILTERS } }))}>clear all filters</button>
                )}
                {filterCount > 0 && '.'}
              </p>
            </div>
          )}
        </div>

        <nav className="flex flex-wrap items-center gap-2 text-sm" aria-label="Pages">
          <button type="button" className="btn-quiet !px-3 !py-1" disabled={view.page <= 1 || loading} onClick={() => setView((v) => ({ ...v, page: v.page - 1 }))}>Previous</button>
          <span>Page {Math.min(view.page, pageCount)} of {pageCount}</span>
          <button type="button" className="btn-quiet !px-3 !py-1" disabled={view.page >= pageCount || loading} onClick={() => setView((v) => ({ ...v, page: v.page + 1 }))}>Next</button>
          <label className="ml-auto flex items-center gap-2" htmlFor="lib-pagesize">
            Rows a page
            <select id="lib-pagesize" className="field !w-auto !py-1" value={view.pageSize} onChange={(e) => setView((v) => ({ ...v, page: 1, pageSize: Number(e.target.value) }))}>
              {PAGE_SIZES.map((n) => <option key={n} value={n}>{n}</option>)}
            </select>
          </label>
        </nav>
        {canSearch && <p className="text-xs text-muted">To identify an unknown, open a record and choose “Search with this spectrum”, or go to Identify.</p>}
      </section>
    </div>
  );
}

export function StatusPill({ status }: { status: string }) {
  const tone: Record<string, string> = {
    released: 'bg-teal-soft text-teal border-teal/40',
    draft: 'bg-paper text-ink-soft border-line',
    in_review: 'bg-copper-soft text-copper border-copper/40',
    superseded: 'bg-paper text-muted border-line',
    retired: 'bg-alert-soft text-alert border-alert/40',
  };
  return <span className={`badge border ${tone[status] ?? 'bg-paper text-ink border-line'}`} data-testid="status-pill">{STATUS_LABEL[status] ?? status}</span>;
}
