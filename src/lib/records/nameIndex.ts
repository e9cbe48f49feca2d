// Typo-tolerant search over record names and synonyms (fuse.js), so that
// "tolune" still finds toluene. Pure: built from rows the caller has read.
import Fuse from 'fuse.js';

export interface NamedRow {
  /** spectrum_version id */
  versionId: number;
  name: string;
  synonyms: string[];
  casRegistryNo?: string | null;
}

export interface NameMatch {
  versionId: number;
  /** 0 is an exact match, 1 no match at all (fuse.js's scale) */
  distance: number;
  /** the synonym that matched, when it was not the name */
  matchedSynonym?: string;
}

export interface NameIndexOptions {
  /**
   * Highest fuse.js distance accepted (0 exact .. 1 anything).
   * @default 0.4
   */
  threshold?: number;
}

export interface NameIndex {
  search(q: string): NameMatch[];
  size: number;
}

/**
 * Build a fuzzy index of names and synonyms. A query that looks like a CAS
 * registry number matches that number exactly instead.
 * @param rows - one row a spectrum version
 * @param options - see {@link NameIndexOptions}
 */
export function buildNameIndex(rows: readonly NamedRow[], options: NameIndexOptions = {}): NameIndex {
  const { threshold = 0.4 } = options;
  if (!(threshold >= 0 && threshold <= 1)) throw new RangeError('threshold must be between 0 and 1');
  const docs = rows.map((r) => ({ versionId: r.versionId, name: r.name, synonyms: r.synonyms ?? [], cas: r.casRegistryNo ?? '' }));
  const fuse = new Fuse(docs, {
    keys: [
      { name: 'name', weight: 2 },
      { name: 'synonyms', weight: 1 },
    ],
    includeScore: true,
    includeMatches: true,
    ignoreLocation: true,
    threshold,
    minMatchCharLength: 2,
  });
  return {
    size: docs.length,
    search(q: string): NameMatch[] {
      const query = q.trim();
      if (query === '') return [];
      if (/^\d{2,7}-\d{2}-\d$/.test(query)) {
        return docs.filter((d) => d.cas === query).map((d) => ({ versionId: d.versionId, distance: 0 }));
      }
      return fuse.search(query).map((r) => {
        const lower = query.toLowerCase();
        const synonymMatches = (r.matches ?? []).filter((m) => m.key === 'synonyms').map((m) => String(m.value));
        const nameHolds = r.item.name.toLowerCase().includes(lower);
        const nameMatched = r.matches?.some((m) => m.key === 'name');
        // Say which synonym matched when it, rather than the name, explains the hit.
        const synonym = nameHolds
          ? undefined
          : (synonymMatches.find((v) => v.toLowerCase().includes(lower)) ?? (nameMatched ? undefined : synonymMatches[0]));
        return { versionId: r.item.versionId, distance: r.score ?? 0, ...(synonym ? { matchedSynonym: synonym } : {}) };
      });
    },
  };
}
