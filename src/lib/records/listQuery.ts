// The query of GET /api/spectra (and its CSV export): parsed from the URL's
// search parameters with zod, lists given as comma-separated values.
import { z } from 'zod';

export const RECORD_STATUSES = ['draft', 'in_review', 'released', 'superseded', 'retired'] as const;
export type RecordStatus = (typeof RECORD_STATUSES)[number];

/** Sort keys a caller may ask for; `-key` sorts descending. `relevance` needs `q`. */
export const SORT_KEYS = ['relevance', 'name', 'formula', 'nominalMass', 'ihd', 'peakCount', 'basePeak', 'status', 'updatedAt', 'id'] as const;
export type SortKey = (typeof SORT_KEYS)[number];

export const MAX_PAGE_SIZE = 200;

const list = <T extends z.ZodType>(item: T) =>
  z
    .string()
    .optional()
    .transform((s) => (s ?? '').split(',').map((x) => x.trim()).filter(Boolean))
    .pipe(z.array(item) as unknown as z.ZodType<z.output<T>[], string[]>);

const element = z.string().regex(/^[A-Z][a-z]?$/, 'an element symbol such as C, Cl or Br');
const optionalNumber = (min: number, max: number) =>
  z
    .string()
    .optional()
    .transform((s) => (s === undefined || s.trim() === '' ? undefined : Number(s)))
    .pipe(z.number().min(min).max(max).optional());

export const spectraListQuerySchema = z.object({
  q: z.string().trim().max(200).optional().transform((s) => (s ? s : undefined)),
  formula: z.string().trim().max(120).optional().transform((s) => (s ? s : undefined)),
  elements: list(element),
  excludeElements: list(element),
  ihdMin: optionalNumber(-10, 1000),
  ihdMax: optionalNumber(-10, 1000),
  massMin: optionalNumber(0, 100000),
  massMax: optionalNumber(0, 100000),
  tags: list(z.string().min(1).max(80)),
  status: list(z.enum(RECORD_STATUSES)),
  synthetic: z.enum(['yes', 'no']).optional(),
  /** only these record ids (e.g. to look up the records behind a hit list) */
  ids: z
    .string()
    .optional()
    .transform((s) => (s ?? '').split(',').map((x) => x.trim()).filter(Boolean).map(Number))
    .pipe(z.array(z.number().int().positive()).max(500)),
  page: z.string().optional().transform((s) => (s ? Number(s) : 1)).pipe(z.number().int().min(1).max(1_000_000)),
  pageSize: z.string().optional().transform((s) => (s ? Number(s) : 25)).pipe(z.number().int().min(1).max(MAX_PAGE_SIZE)),
  sort: z
    .string()
    .optional()
    .transform((s) => s?.trim() || undefined)
    .refine((s) => s === undefined || (SORT_KEYS as readonly string[]).includes(s.replace(/^-/, '')), {
      message: `sort must be one of ${SORT_KEYS.join(', ')} (prefix "-" for descending)`,
    }),
});

export type SpectraListQuery = z.infer<typeof spectraListQuerySchema>;

export interface ParsedSort {
  key: SortKey;
  descending: boolean;
}

/** The effective sort: as asked, else relevance when searching by name, else name A→Z. */
export function effectiveSort(query: { sort?: string; q?: string }): ParsedSort {
  if (!query.sort) return query.q ? { key: 'relevance', descending: false } : { key: 'name', descending: false };
  const descending = query.sort.startsWith('-');
  const key = query.sort.replace(/^-/, '') as SortKey;
  if (key === 'relevance' && !query.q) return { key: 'name', descending: false };
  return { key, descending };
}
