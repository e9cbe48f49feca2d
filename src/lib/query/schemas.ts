// zod schemas shared by the search and interpretation routes (API.md).
import { z } from 'zod';

export const MAX_QUERY_PEAKS = 10_000;
export const MAX_MZ = 5000;

const mz = z.number({ error: 'm/z must be a number' }).finite('m/z must be finite').gt(0, 'm/z must be above 0').lte(MAX_MZ, `m/z must be at most ${MAX_MZ}`);
const intensity = z.number({ error: 'intensity must be a number' }).finite('intensity must be finite').gte(0, 'intensity must not be negative');
export const peaksSchema = z
  .array(z.tuple([mz, intensity]), { error: 'peaks must be a list of [m/z, intensity] pairs' })
  .min(1, 'peaks must hold at least one peak')
  .max(MAX_QUERY_PEAKS, `at most ${MAX_QUERY_PEAKS} peaks`);

const mass = z.number().finite().min(0, 'must be at least 0').max(MAX_MZ, `must be at most ${MAX_MZ}`);
const element = z.string().regex(/^[A-Z][a-z]?$/, 'an element symbol such as Cl');
const elementList = z.union([z.array(element), z.string().transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean))]).pipe(z.array(element));

export const filtersSchema = z
  .object({
    formula: z.string().max(200).optional(),
    elements: elementList.optional(),
    excludeElements: elementList.optional(),
    ihdMin: z.number().finite().min(-10).max(200).optional(),
    ihdMax: z.number().finite().min(-10).max(200).optional(),
    massMin: mass.optional(),
    massMax: mass.optional(),
    tags: z.array(z.string().max(80)).max(50).optional(),
    status: z.array(z.enum(['released', 'in_review', 'draft'])).min(1).optional(),
    ri: z
      .object({
        value: z.number().finite().min(0).max(10000),
        window: z.number().finite().gt(0).max(2000),
        phase: z.string().min(1).max(40).default('non-polar'),
        penalty: z.number().min(0).max(1).optional(),
      })
      .strict()
      .optional(),
  })
  .strict();

export const SCORE_NAMES = ['cosine', 'reverseCosine', 'composite', 'entropy'] as const;

export const optionsSchema = z
  .object({
    rankBy: z.enum(SCORE_NAMES, { error: `rankBy must be one of ${SCORE_NAMES.join(', ')}` }).optional(),
    weights: z.object({ mz: z.number().finite().min(0).max(6), intensity: z.number().finite().gt(0).max(3) }).strict().optional(),
    lowMassCutoff: z.number().finite().min(0).max(MAX_MZ).optional(),
    excludeIons: z.array(mz).max(500).optional(),
    tolerance: z.number().finite().gt(0).max(5).optional(),
    noiseFloor: z.number().finite().min(0).max(1).optional(),
  })
  .strict();

export const queryForms = {
  peaks: peaksSchema.optional(),
  jcamp: z.string().min(1).max(5_000_000).optional(),
  spectrumId: z.number().int().positive().optional(),
  version: z.number().int().positive().optional(),
};

function exactlyOneQuery(v: { peaks?: unknown; jcamp?: unknown; spectrumId?: unknown }) {
  return [v.peaks, v.jcamp, v.spectrumId].filter((x) => x !== undefined).length === 1;
}

export const searchBodySchema = z
  .object({
    ...queryForms,
    filters: filtersSchema.optional(),
    options: optionsSchema.optional(),
    limit: z.number().int().min(1, 'limit must be 1..500').max(500, 'limit must be 1..500').optional(),
  })
  .strict()
  .refine(exactlyOneQuery, { message: 'give exactly one of peaks, jcamp or spectrumId', path: ['peaks'] })
  .refine((v) => !(v.filters?.massMin !== undefined && v.filters?.massMax !== undefined && v.filters.massMin > v.filters.massMax), {
    message: 'massMin must not exceed massMax',
    path: ['filters', 'massMin'],
  });

export const interpretBodySchema = z
  .object({ ...queryForms })
  .strict()
  .refine(exactlyOneQuery, { message: 'give exactly one of peaks, jcamp or spectrumId', path: ['peaks'] });

export const batchBodySchema = z
  .object({
    queries: z
      .array(z.object({ id: z.union([z.string().max(200), z.number()]).optional(), peaks: peaksSchema }).strict())
      .min(1)
      .max(10_000, 'at most 10,000 queries')
      .optional(),
    jcamp: z.string().min(1).max(60_000_000).optional(),
    filters: filtersSchema.optional(),
    options: optionsSchema.optional(),
    limit: z.number().int().min(1).max(500).optional(),
  })
  .strict()
  .refine((v) => (v.queries === undefined) !== (v.jcamp === undefined), { message: 'give either queries or jcamp', path: ['queries'] });
