import type { Peak } from './types';

/** Drop peaks whose m/z or intensity is not a finite number > 0. */
export function dropInvalid(peaks: readonly Peak[]): Peak[] {
  const out: Peak[] = [];
  for (const p of peaks) {
    if (!Array.isArray(p) && !(p && typeof p === 'object')) continue;
    const mz = p[0];
    const intensity = p[1];
    if (typeof mz !== 'number' || typeof intensity !== 'number') continue;
    if (!Number.isFinite(mz) || !Number.isFinite(intensity) || mz <= 0 || intensity <= 0) continue;
    out.push([mz, intensity]);
  }
  return out;
}
