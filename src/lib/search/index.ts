// The search engine: preprocessing, the four scores, the shared-memory index
// with exact pruned top-k, the worker pool, and the brute-force reference.
export * from './types';
export { SearchIndex } from './SearchIndex';
export { centroid, type CentroidOptions } from './centroid';
export { dropInvalid } from './dropInvalid';
export { binPeaks, binOf, type BinOptions } from './binPeaks';
export { normalizeToBase } from './normalizeToBase';
export { applyNoiseFloor } from './applyNoiseFloor';
export { applyLowMassCutoff } from './applyLowMassCutoff';
export { excludeIons, AIR_WATER_BLEED_IONS } from './excludeIons';
export { weightPeaks, DEFAULT_WEIGHTS } from './weightPeaks';
export { entropyWeights, spectralEntropy } from './entropyWeights';
export { cosineScore } from './cosineScore';
export { reverseCosineScore } from './reverseCosineScore';
export { compositeScore, compositeParts } from './compositeScore';
export { entropySimilarity, entropySharedTerm } from './entropySimilarity';
export { bruteForceSearch } from './bruteForceSearch';
export { compileFilters, checkFilters, hillKey, type EntryMeta } from './filters';
export { resolveSearchOptions, resolveIndexOptions, DEFAULT_LIMIT, MAX_LIMIT, type IndexOptions, type ResolvedSearchOptions } from './options';
export { getSearchPool, closeSearchPool, locateSearchWorker, type WorkerLocation } from './pool';
export type { StoredColumns } from './segment';
