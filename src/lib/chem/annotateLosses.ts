import { commonLosses, type LossComposition } from './commonLosses';
import { parseFormula } from './parseFormula';
import { toUnitSpectrum, type UnitSpectrum } from './toUnitSpectrum';
import type { Peak } from './types';

export interface AnnotateLossesOptions {
  /**
   * Peaks below this relative intensity (base peak = 100) are not annotated.
   * @default 1
   */
  minRelative?: number;
  /**
   * The compound's formula, when known: only losses that the formula can
   * afford (every element of the loss present in at least that number) are
   * kept, so an alkane is not annotated with losses of O or F.
   * @default undefined (no restriction)
   */
  formula?: string;
}

export interface LossAnnotation {
  fromMz: number;
  toMz: number;
  /** nominal mass lost */
  loss: number;
  /** the likely compositions joined with " or ", e.g. "CO or C2H4" */
  composition: string;
  compositions: LossComposition[];
  /** relative intensity of the peak at toMz (base peak = 100) */
  relative: number;
}

const byLoss = new Map(commonLosses.map((entry) => [entry.loss, entry]));

/**
 * Marks the peaks below M whose distance from M is one of the common neutral
 * losses (see `commonLosses`), highest m/z first.
 * @param peaks - the spectrum (`[mz, intensity]`) or a unit spectrum
 * @param mMz - m/z of the molecular ion
 * @param options - see {@link AnnotateLossesOptions}
 */
export function annotateLosses(
  peaks: readonly Peak[] | UnitSpectrum,
  mMz: number,
  options: AnnotateLossesOptions = {},
): LossAnnotation[] {
  const { minRelative = 1, formula } = options;
  let available: Record<string, number> | null = null;
  if (formula) {
    try {
      available = parseFormula(formula).elements;
    } catch {
      available = null; // an unreadable formula restricts nothing
    }
  }
  const affordable = (c: LossComposition) => {
    if (!available) return true;
    const need = parseFormula(c.formula).elements;
    return Object.entries(need).every(([el, n]) => (available[el] ?? 0) >= (n as number));
  };
  if (!(minRelative >= 0 && minRelative <= 100)) throw new RangeError('minRelative must be between 0 and 100');
  if (!Number.isFinite(mMz) || mMz <= 0) throw new RangeError(`mMz must be a positive number, got ${mMz}`);
  const unit = Array.isArray(peaks) ? toUnitSpectrum(peaks as Peak[]) : (peaks as UnitSpectrum);
  const m = Math.round(mMz);
  const annotations: LossAnnotation[] = [];
  for (const mz of [...unit.masses].reverse()) {
    if (mz >= m) continue;
    const relative = unit.intensities.get(mz) ?? 0;
    const entry = byLoss.get(m - mz);
    if (!entry || relative < minRelative) continue;
    const compositions = entry.compositions.filter(affordable);
    if (compositions.length === 0) continue;
    annotations.push({
      fromMz: m,
      toMz: mz,
      loss: entry.loss,
      composition: compositions.map((c) => c.formula).join(' or '),
      compositions,
      relative,
    });
  }
  return annotations;
}
