// The editable fields of a record version (issue 5, item 5) and their limits.
// Shared by PATCH /api/spectra/:id and the record edit form, so the form can
// show the same field-level messages the API answers with.
import { z } from 'zod';

const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);
const text = (max: number) => z.preprocess(blankToNull, z.string().trim().max(max, `at most ${max} characters`).nullable());
const number = (min: number, max: number, what: string) =>
  z.preprocess(
    (v) => (v === '' || v === undefined ? null : typeof v === 'string' ? Number(v) : v),
    z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be a number`).min(min, `${what} must be at least ${min}`).max(max, `${what} must be at most ${max}`).nullable(),
  );

export const retentionIndexSchema = z.object({
  phase: z.string().trim().min(1, 'say the stationary-phase class (e.g. non-polar, semi-polar, polar)').max(40),
  value: z.number({ error: 'the retention index must be a number' }).refine(Number.isFinite, 'the retention index must be a number').min(0).max(100000),
  ladder: text(255).optional(),
  column: text(255).optional(),
});

export const editFieldsShape = {
  name: z.string().trim().min(1, 'a name is required').max(255, 'at most 255 characters'),
  synonyms: z.array(z.string().trim().min(1).max(255)).max(200),
  formula: text(120),
  smiles: text(60000),
  molfile: z.preprocess(blankToNull, z.string().max(2_000_000).nullable()),
  casRegistryNo: text(20),
  retentionIndices: z.array(retentionIndexSchema).max(50),
  ionizationEnergy: number(0.1, 1000, 'the ionization energy'),
  massRangeMin: number(0.1, 100000, 'the lowest m/z'),
  massRangeMax: number(0.1, 100000, 'the highest m/z'),
  analyzerType: text(80),
  sourceTemperature: number(-50, 1000, 'the source temperature'),
  instrument: text(255),
  method: text(255),
  referenceLot: text(120),
  referencePurity: text(60),
  acquiredAt: text(40),
  acquiredBy: text(255),
  derivative: text(120),
  parentCompound: text(255),
  saltForm: text(120),
  notes: text(20000),
};

export const EDIT_FIELDS = Object.keys(editFieldsShape) as (keyof typeof editFieldsShape)[];
export type EditField = (typeof EDIT_FIELDS)[number];

export const patchSchema = z
  .object({
    ...editFieldsShape,
    tags: z.array(z.string().trim().min(1).max(80)).max(100),
    reason: z.string().trim().min(1).max(2000),
    /** the version the editor saw; a newer one answers 409 */
    baseVersion: z.number().int().positive(),
  })
  .partial()
  .strict();

export type PatchInput = z.infer<typeof patchSchema>;
export type EditFields = Partial<Pick<PatchInput, EditField>>;
