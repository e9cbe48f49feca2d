export interface AlkaneStandard {
  /** carbon number of the n-alkane */
  carbons: number;
  /** its retention time (any unit, the same as the unknown's) */
  rt: number;
}

/**
 * Linear retention index for temperature-programmed runs (van den Dool and Kratz):
 * RI = 100 [n + (t - t_n) / (t_(n+1) - t_n)], between the n-alkanes eluting just
 * before and after the compound. Where the ladder skips carbon numbers (C_n, then
 * C_N), RI = 100 [n + (N - n)(t - t_n) / (t_N - t_n)]. Indices are meaningful only
 * with a ladder run on the same stationary-phase class.
 * @param t - retention time of the compound
 * @param ladder - the n-alkane ladder, in any order
 * @throws {RangeError} when t lies outside the ladder or the ladder is malformed
 */
export function retentionIndex(t: number, ladder: readonly AlkaneStandard[]): number {
  if (!Number.isFinite(t) || t < 0) throw new RangeError(`retention time must be a number >= 0, got ${t}`);
  if (!Array.isArray(ladder) || ladder.length < 2) throw new RangeError('ladder needs at least two n-alkanes');
  const sorted = [...ladder].sort((a, b) => a.carbons - b.carbons);
  for (const [i, s] of sorted.entries()) {
    if (!Number.isInteger(s.carbons) || s.carbons < 1) {
      throw new RangeError(`ladder carbons must be integers >= 1, got ${s.carbons}`);
    }
    if (!Number.isFinite(s.rt) || s.rt < 0) throw new RangeError(`ladder rt must be numbers >= 0, got ${s.rt}`);
    if (i > 0 && s.carbons === sorted[i - 1].carbons) throw new RangeError(`ladder lists C${s.carbons} twice`);
    if (i > 0 && s.rt <= sorted[i - 1].rt) {
      throw new RangeError(`ladder retention times must increase with carbon number (C${s.carbons})`);
    }
  }
  const first = sorted[0];
  const last = sorted.at(-1)!;
  if (t < first.rt || t > last.rt) {
    throw new RangeError(
      `retention time ${t} lies outside the ladder (C${first.carbons} at ${first.rt} to C${last.carbons} at ${last.rt})`,
    );
  }
  let i = sorted.findIndex((s) => s.rt >= t);
  if (sorted[i].rt === t) return 100 * sorted[i].carbons;
  i -= 1;
  const before = sorted[i];
  const after = sorted[i + 1];
  return 100 * (before.carbons + ((after.carbons - before.carbons) * (t - before.rt)) / (after.rt - before.rt));
}
