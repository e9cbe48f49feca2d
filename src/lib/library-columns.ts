// Packed peak lists (src/lib/spectra encodePeaks) straight into the search
// index's stored columns, without a [mz, intensity] array per peak. Pure code.
//
// The result must equal what storeSpectrum (src/lib/search/prepare.ts) makes
// of decodePeaks(packed), bit for bit. The common case (every peak valid,
// sorted by m/z, centroided) is done here in one pass over typed arrays;
// anything else (invalid or zero-intensity peaks, unsorted m/z, profile data,
// a malformed buffer) goes through decodePeaks and storeSpectrum themselves.
import { storeSpectrum } from './search/prepare';
import { binSortedRuns, checkTolerance } from './search/binPeaks';
import { CENTROID_MAX_GAP, looksLikeProfile } from './search/centroid';
import { checkNoiseFloor } from './search/applyNoiseFloor';
import type { StoredColumns } from './search/segment';
import { decodePeaks, PACKED_PEAKS_MAGIC } from './spectra/index';


/** Peaks per block of the builder (8 MB of bins and intensities). */
const BLOCK_PEAKS = 1 << 20;

const MAGIC = [0, 1, 2, 3].map((i) => PACKED_PEAKS_MAGIC.charCodeAt(i));

function grow<T extends Float64Array | Uint32Array>(a: T, need: number): T {
  if (need <= a.length) return a;
  let size = Math.max(16, a.length);
  while (size < need) size *= 2;
  const b = new (a.constructor as new (n: number) => T)(size);
  b.set(a);
  return b;
}

/**
 * Collects spectra one packed buffer at a time into StoredColumns (bins and
 * base-relative Float32 intensities), in the order added.
 */
export class StoredColumnsBuilder {
  readonly tolerance: number;
  readonly noiseFloor: number;
  private count = 0;
  /** Peaks in the filled blocks plus the current one. */
  private nPeaks = 0;
  private offsets = new Uint32Array(1024);
  // Peaks go into blocks, joined once by finish(), rather than into one array
  // grown by copying.
  private full: { bins: Int32Array; rel: Float32Array; len: number }[] = [];
  private bins = new Int32Array(BLOCK_PEAKS);
  private rel = new Float32Array(BLOCK_PEAKS);
  /** Peaks in the current block. */
  private used = 0;
  private recordIds = new Float64Array(1024);
  private spectrumIds = new Float64Array(1024);
  // Scratch: an aligned copy of one packed buffer (with Float64 and Float32
  // views of the same memory), and per-bin sums.
  private scratch = new Uint8Array(8 + 12 * 256);
  private scratch64 = new Float64Array(this.scratch.buffer);
  private scratch32 = new Float32Array(this.scratch.buffer);
  private binNo = new Float64Array(256);
  private binSum = new Float64Array(256);

  constructor(tolerance = 1, noiseFloor = 0) {
    checkTolerance(tolerance);
    checkNoiseFloor(noiseFloor);
    this.tolerance = tolerance;
    this.noiseFloor = noiseFloor;
  }

  /** Add one spectrum from its packed peaks; throws decodePeaks's RangeError for a malformed buffer. */
  add(spectrumId: number, recordId: number, packed: Uint8Array): void {
    const d = this.count;
    this.offsets = grow(this.offsets, d + 2);
    this.recordIds = grow(this.recordIds, d + 1);
    this.spectrumIds = grow(this.spectrumIds, d + 1);
    this.offsets[d] = this.nPeaks;
    if (!this.addFast(packed)) this.addSlow(packed);
    this.recordIds[d] = recordId;
    this.spectrumIds[d] = spectrumId;
    this.count = d + 1;
    this.offsets[d + 1] = this.nPeaks;
  }

  /** The columns collected so far (the builder is spent afterwards). */
  finish(): StoredColumns {
    const n = this.count;
    let bins: Int32Array;
    let rel: Float32Array;
    if (this.full.length === 0) {
      bins = this.bins.subarray(0, this.used);
      rel = this.rel.subarray(0, this.used);
    } else {
      this.full.push({ bins: this.bins, rel: this.rel, len: this.used });
      bins = new Int32Array(this.nPeaks);
      rel = new Float32Array(this.nPeaks);
      let at = 0;
      for (const b of this.full) {
        bins.set(b.bins.subarray(0, b.len), at);
        rel.set(b.rel.subarray(0, b.len), at);
        at += b.len;
      }
    }
    this.full = [];
    this.bins = new Int32Array(0);
    this.rel = new Float32Array(0);
    this.used = 0;
    return {
      count: n,
      offsets: this.offsets.subarray(0, n + 1),
      bins,
      rel,
      recordIds: this.recordIds.subarray(0, n),
      spectrumIds: this.spectrumIds.subarray(0, n),
    };
  }

  /** Room for `len` more peaks in the current block. */
  private reserve(len: number): void {
    if (this.used + len <= this.bins.length) return;
    if (this.used > 0) this.full.push({ bins: this.bins, rel: this.rel, len: this.used });
    const size = Math.max(BLOCK_PEAKS, len);
    this.bins = new Int32Array(size);
    this.rel = new Float32Array(size);
    this.used = 0;
  }

  private append(bins: ArrayLike<number>, rel: ArrayLike<number>, len: number): void {
    this.reserve(len);
    const at = this.used;
    for (let i = 0; i < len; i++) {
      this.bins[at + i] = bins[i];
      this.rel[at + i] = rel[i];
    }
    this.used = at + len;
    this.nPeaks += len;
  }

  /** The general case: exactly storeSpectrum(decodePeaks(packed)). */
  private addSlow(packed: Uint8Array): void {
    const s = storeSpectrum(decodePeaks(packed), this.tolerance, this.noiseFloor);
    this.append(s.bins, s.rel, s.bins.length);
  }

  /**
   * The common case in one pass; false (nothing written) when the spectrum
   * needs the general path.
   */
  private addFast(packed: Uint8Array): boolean {
    if (!(packed instanceof Uint8Array) || packed.length < 8) return false;
    if (packed[0] !== MAGIC[0] || packed[1] !== MAGIC[1] || packed[2] !== MAGIC[2] || packed[3] !== MAGIC[3]) return false;
    const n = (packed[4] | (packed[5] << 8) | (packed[6] << 16) | (packed[7] << 24)) >>> 0;
    if (packed.length !== 8 + 12 * n) return false;
    if (n === 0) return true; // storeSpectrum of no peaks: no peaks
    // Copy to offset 0 of an own buffer: the driver's Buffer may sit at an unaligned offset.
    if (this.scratch.length < packed.length) {
      this.scratch = new Uint8Array(8 * Math.ceil((packed.length * 2) / 8));
      this.scratch64 = new Float64Array(this.scratch.buffer);
      this.scratch32 = new Float32Array(this.scratch.buffer);
    }
    this.scratch.set(packed);
    // m/z i is Float64 number 1 + i of the buffer, intensity i Float32 number 2 + 2n + i.
    const mz = this.scratch64;
    const intensity = this.scratch32;
    const mz0 = 1;
    const in0 = 2 + 2 * n;

    // dropInvalid would drop nothing, centroid would only sort (a no-op on sorted input).
    let close = 0;
    let prev = 0;
    for (let i = 0; i < n; i++) {
      const m = mz[mz0 + i];
      const y = intensity[in0 + i];
      if (!(m > 0 && m < Infinity && y > 0 && y < Infinity)) return false;
      if (i > 0) {
        if (m < prev) return false;
        if (m - prev <= CENTROID_MAX_GAP) close++;
      }
      prev = m;
    }
    if (looksLikeProfile(close, n)) return false; // profile data: centroid would merge points

    // binPeaks (each bin one run of the sorted m/z).
    const tol = this.tolerance;
    if (this.binNo.length < n) {
      this.binNo = new Float64Array(n * 2);
      this.binSum = new Float64Array(n * 2);
    }
    const binNo = this.binNo;
    const binSum = this.binSum;
    const nb = binSortedRuns(mz, mz0, intensity, in0, n, tol, binNo, binSum);
    // normalizeToBase, then the noise floor, then storeSpectrum's rounding to the stored types.
    let base = 0;
    for (let j = 0; j < nb; j++) if (binSum[j] > base) base = binSum[j];
    if (!(base > 0)) return true;
    const floor = this.noiseFloor;
    this.reserve(nb);
    const start = this.used;
    let at = start;
    const bins = this.bins;
    const rel = this.rel;
    for (let j = 0; j < nb; j++) {
      const r = binSum[j] / base;
      if (floor !== 0 && !(r >= floor)) continue;
      const binMz = tol === 1 ? binNo[j] : binNo[j] * tol;
      bins[at] = Math.round(binMz / tol);
      rel[at] = r;
      at++;
    }
    this.used = at;
    this.nPeaks += at - start;
    return true;
  }
}
