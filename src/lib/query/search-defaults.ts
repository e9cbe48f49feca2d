// The lab's search defaults (admin settings 'search-defaults', versioned),
// cached briefly so that a search does not wait on the database for them.
import { QueryTypes } from 'sequelize';
import { getSequelize } from '../db/sequelize';

export interface SearchDefaults {
  rankBy: 'cosine' | 'reverseCosine' | 'composite' | 'entropy';
  weights: { mz: number; intensity: number };
  lowMassCutoff?: number;
  excludeIons?: number[];
  limit: number;
}

export const BUILT_IN_SEARCH_DEFAULTS: SearchDefaults = { rankBy: 'composite', weights: { mz: 3, intensity: 0.6 }, limit: 50 };

let cache: { at: number; value: SearchDefaults } | null = null;

export async function getSearchDefaults(): Promise<SearchDefaults> {
  if (cache && Date.now() - cache.at < 5000) return cache.value;
  let value = BUILT_IN_SEARCH_DEFAULTS;
  try {
    const [row] = await getSequelize().query<{ value: unknown }>(
      "SELECT value FROM setting WHERE name = 'search-defaults' ORDER BY version DESC LIMIT 1",
      { type: QueryTypes.SELECT },
    );
    if (row) {
      const v = typeof row.value === 'string' ? JSON.parse(row.value) : row.value;
      value = { ...BUILT_IN_SEARCH_DEFAULTS, ...(v as object) };
    }
  } catch {
    /* database down: the built-in defaults keep search working on the in-memory index */
  }
  cache = { at: Date.now(), value };
  return value;
}

export function clearSearchDefaultsCache() {
  cache = null;
}
