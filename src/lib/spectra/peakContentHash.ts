import { createHash } from 'node:crypto';

import { normalizePeaksForHash, type NormalizePeaksForHashOptions } from './normalizePeaksForHash';
import type { Peak } from './types';

/**
 * SHA-256 (hex) of a spectrum's normalized, unit-binned peaks (see
 * normalizePeaksForHash), so that the same spectrum exported and imported
 * again gets the same hash. The hashed text is `mz:relative` pairs joined by
 * `;`, relative intensity with exactly `decimals` places.
 * @param peaks - [m/z, intensity] pairs.
 * @param options - precision.
 * @returns 64 lower-case hex digits.
 */
export function peakContentHash(peaks: Peak[], options: NormalizePeaksForHashOptions = {}): string {
  const { decimals = 3 } = options;
  const normalized = normalizePeaksForHash(peaks, { decimals });
  const text = normalized.map(([mz, relative]) => `${mz}:${relative.toFixed(decimals)}`).join(';');
  return createHash('sha256').update(text, 'utf8').digest('hex');
}
