// The Library page's view state <-> URL search parameters (the same names as
// GET /api/spectra), so a view can be shared as a link.

export interface LibraryFilters {
  q: string;
  formula: string;
  elements: string;
  excludeElements: string;
  ihdMin: string;
  ihdMax: string;
  massMin: string;
  massMax: string;
  tags: string;
  status: string;
}

export interface LibraryView {
  filters: LibraryFilters;
  page: number;
  pageSize: number;
  sort: string;
  /** hidden column ids, when not the default */
  hidden: string[] | null;
}

export const EMPTY_FILTERS: LibraryFilters = {
  q: '', formula: '', elements: '', excludeElements: '', ihdMin: '', ihdMax: '', massMin: '', massMax: '', tags: '', status: '',
};

export const PAGE_SIZES = [25, 50, 100];

export function viewFromSearch(search: string): LibraryView {
  const p = new URLSearchParams(search);
  const filters = { ...EMPTY_FILTERS };
  for (const k of Object.keys(filters) as (keyof LibraryFilters)[]) filters[k] = p.get(k) ?? '';
  const page = Math.max(1, Number(p.get('page')) || 1);
  const size = Number(p.get('pageSize'));
  const hidden = p.get('hide');
  return {
    filters,
    page,
    pageSize: PAGE_SIZES.includes(size) ? size : 25,
    sort: p.get('sort') ?? '',
    hidden: hidden === null ? null : hidden.split(',').filter(Boolean),
  };
}

/** The API's query string for a view (no column choice). */
export function apiSearch(view: LibraryView): URLSearchParams {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(view.filters)) if (v.trim() !== '') p.set(k, v.trim());
  if (view.sort) p.set('sort', view.sort);
  if (view.page > 1) p.set('page', String(view.page));
  if (view.pageSize !== 25) p.set('pageSize', String(view.pageSize));
  return p;
}

/** The page's own query string: the API's plus the hidden columns. */
export function pageSearch(view: LibraryView): string {
  const p = apiSearch(view);
  if (view.hidden !== null) p.set('hide', view.hidden.join(','));
  const s = p.toString();
  return s ? `?${s}` : '';
}

export function activeFilterCount(filters: LibraryFilters): number {
  return Object.values(filters).filter((v) => v.trim() !== '').length;
}
