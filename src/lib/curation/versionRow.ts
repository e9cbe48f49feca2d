// Reading version rows: JSON columns may come back as text from raw queries.
export function jsonValue<T>(value: unknown, fallback: T): T {
  if (value === null || value === undefined) return fallback;
  if (typeof value !== 'string') return value as T;
  try {
    return JSON.parse(value) as T;
  } catch {
    return fallback;
  }
}

/** The fields that make up a version's content (everything but workflow bookkeeping). */
export const CONTENT_FIELDS = [
  'name', 'synonyms', 'formula', 'nominalMass', 'monoisotopicMass', 'averageMass', 'ihd', 'elements', 'smiles', 'molfile',
  'casRegistryNo', 'derivative', 'parentCompound', 'saltForm', 'technique', 'ionizationMode', 'ionizationEnergy', 'instrument',
  'analyzerType', 'sourceTemperature', 'massRangeMin', 'massRangeMax', 'method', 'retentionTime', 'referenceLot',
  'referencePurity', 'acquiredAt', 'acquiredBy', 'origin', 'owner', 'notes', 'metadata', 'peakCount', 'basePeakMz',
  'contentHash', 'sourceFileName', 'synthetic',
] as const;

export function sameValue(a: unknown, b: unknown): boolean {
  return JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
}
