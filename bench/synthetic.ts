// Seeded synthetic libraries for the benchmark, generated straight into typed
// arrays (no object per spectrum). Synthetic, for measurement only.
import type { StoredColumns } from '../src/lib/search/segment';
import type { Peak } from '../src/lib/search/types';

/** mulberry32: a small, seedable PRNG. */
export function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function gauss(r: () => number): number {
  const u = Math.max(r(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * r());
}

// Ions common to many EI spectra (alkyl, alkenyl, aromatic series), drawn more often.
const COMMON = [39, 41, 42, 43, 50, 51, 53, 55, 56, 57, 63, 65, 67, 69, 70, 71, 77, 78, 79, 81, 83, 85, 91, 92, 95, 97, 105, 115, 128, 149];

/**
 * A library of `count` spectra, about 80 peaks each (60..100), m/z 30..650,
 * skewed towards low m/z: each spectrum has a top mass M (skewed low too), its
 * peaks fall in 30..M with density falling with m/z, a quarter of them on
 * common series ions; intensities are log-spread over two decades, larger at
 * low m/z, with one base peak.
 */
export function syntheticColumns(count: number, seed: number): StoredColumns & { bins: Uint16Array } {
  const r = rng(seed);
  const cap = count * 100;
  const offsets = new Uint32Array(count + 1);
  const bins = new Uint16Array(cap);
  const rel = new Float32Array(cap);
  const recordIds = new Float64Array(count);
  const spectrumIds = new Float64Array(count);
  const mark = new Uint8Array(700);
  const tmp: number[] = [];
  let at = 0;
  for (let d = 0; d < count; d++) {
    offsets[d] = at;
    recordIds[d] = d + 1;
    spectrumIds[d] = d + 1;
    const top = 80 + Math.floor(570 * r() ** 1.6);
    const span = top - 30;
    const n = Math.min(span, 60 + Math.floor(r() * 41));
    tmp.length = 0;
    while (tmp.length < n) {
      let m: number;
      if (r() < 0.25) m = COMMON[Math.floor(r() * COMMON.length)];
      else m = 30 + Math.floor(span * r() ** 1.8);
      if (m > top || mark[m]) continue;
      mark[m] = 1;
      tmp.push(m);
    }
    tmp.sort((a, b) => a - b);
    let base = 0;
    const start = at;
    for (const m of tmp) {
      mark[m] = 0;
      const lowBoost = 1 - 0.6 * ((m - 30) / span);
      const v = Math.exp(-4.6 * r()) * lowBoost;
      bins[at] = m;
      rel[at] = v;
      if (v > base) base = v;
      at++;
    }
    // One base peak, then scale to it.
    const b = start + Math.floor(r() * (at - start));
    rel[b] = base * 1.5;
    base *= 1.5;
    for (let j = start; j < at; j++) rel[j] = rel[j] / base;
  }
  offsets[count] = at;
  return { count, offsets, bins: bins.subarray(0, at), rel: rel.subarray(0, at), recordIds, spectrumIds };
}

/** Peaks of doc d of a column set, as a peak list. */
export function docPeaks(cols: StoredColumns, d: number): Peak[] {
  const out: Peak[] = [];
  for (let j = cols.offsets[d]; j < cols.offsets[d + 1]; j++) out.push([cols.bins[j], cols.rel[j]]);
  return out;
}

/**
 * A replicate measurement of a library spectrum: multiplicative intensity
 * noise, small peaks dropped at random, background peaks added.
 */
export function noisyReplicate(peaks: Peak[], r: () => number, level: { noise: number; dropBelow: number; dropP: number; background: number }): Peak[] {
  const out: Peak[] = [];
  for (const [mz, i] of peaks) {
    if (i < level.dropBelow && r() < level.dropP) continue;
    out.push([mz, Math.max(1e-6, i * Math.exp(level.noise * gauss(r)))]);
  }
  for (let k = 0; k < level.background; k++) out.push([30 + Math.floor(r() * 400), 0.002 + 0.05 * r() ** 2]);
  if (out.length === 0) out.push(peaks[0]);
  return out;
}
