// Record fields that JCAMP-DX has no label for travel as `$` user labels, so
// that export then import gives back the same record.
import { canonicalLabel } from '../spectra/canonicalLabel';
import { parseLeadingNumber } from '../spectra/parseJcampNumber';

export const USER_LABEL_FIELDS = [
  { label: 'SMILES', field: 'smiles', kind: 'text', max: 60000 },
  { label: 'ANALYZER TYPE', field: 'analyzerType', kind: 'text', max: 80 },
  { label: 'SOURCE TEMPERATURE', field: 'sourceTemperature', kind: 'number' },
  { label: 'MASS RANGE MIN', field: 'massRangeMin', kind: 'number' },
  { label: 'MASS RANGE MAX', field: 'massRangeMax', kind: 'number' },
  { label: 'METHOD', field: 'method', kind: 'text', max: 255 },
  { label: 'REFERENCE LOT', field: 'referenceLot', kind: 'text', max: 120 },
  { label: 'REFERENCE PURITY', field: 'referencePurity', kind: 'text', max: 60 },
  { label: 'ACQUISITION DATE', field: 'acquiredAt', kind: 'text', max: 40 },
  { label: 'ANALYST', field: 'acquiredBy', kind: 'text', max: 255 },
  { label: 'DERIVATIVE', field: 'derivative', kind: 'text', max: 120 },
  { label: 'PARENT COMPOUND', field: 'parentCompound', kind: 'text', max: 255 },
  { label: 'SALT FORM', field: 'saltForm', kind: 'text', max: 120 },
] as const;

export type UserLabelField = (typeof USER_LABEL_FIELDS)[number]['field'];

const byCanon = new Map<string, (typeof USER_LABEL_FIELDS)[number]>(USER_LABEL_FIELDS.map((f) => [canonicalLabel(f.label), f]));

/** The record fields carried by a file's `$` labels. */
export function fieldsFromUserLabels(userLabels: Record<string, string>): Partial<Record<UserLabelField, string | number>> {
  const out: Partial<Record<UserLabelField, string | number>> = {};
  for (const [key, raw] of Object.entries(userLabels)) {
    const f = byCanon.get(canonicalLabel(key));
    if (!f || out[f.field] !== undefined) continue;
    const value = String(raw).trim();
    if (value === '' || value === '?') continue;
    if (f.kind === 'number') {
      const n = parseLeadingNumber(value);
      if (n !== null && Number.isFinite(n)) out[f.field] = n;
    } else {
      out[f.field] = value.slice(0, f.max);
    }
  }
  return out;
}

export function isFieldLabel(key: string): boolean {
  return byCanon.has(canonicalLabel(key));
}
