import { findIsotopeClusters, type IsotopeCluster } from './findIsotopeClusters';
import { toUnitSpectrum, type UnitSpectrum } from './toUnitSpectrum';
import type { Peak } from './types';

export interface FindMolecularIonOptions {
  /**
   * Peaks below this relative intensity (base peak = 100) are not significant.
   * @default 0.5
   */
  minRelative?: number;
  /**
   * A peak below M counts as implying a loss only from this relative intensity
   * (base peak = 100) and from a tenth of the M peak's intensity.
   * @default 5
   */
  lossMinRelative?: number;
  /**
   * Below this confidence the answer is null: no molecular ion seen.
   * @default 0.2
   */
  minConfidence?: number;
}

export interface MolecularIonCandidate {
  /** m/z of M, the lightest member of the highest-mass significant cluster */
  mz: number;
  /** relative intensity of M (base peak = 100) */
  relative: number;
  /** 0..1 */
  confidence: number;
  reasons: string[];
  cluster: IsotopeCluster;
}

/** Losses from M that few compounds show: about 3 to 14 and 21 to 25 u (19 F and 20 HF are real). */
function isUnusualLoss(loss: number): boolean {
  return (loss >= 3 && loss <= 14) || (loss >= 21 && loss <= 25);
}

/**
 * The molecular-ion candidate of an EI spectrum: the lightest member of the
 * highest-mass significant isotope cluster, with a confidence from 0 to 1 and the
 * reasons. It is doubted, not discarded, when peaks below it imply unusual losses.
 * Many EI spectra show no molecular ion: a low confidence gives null.
 * @param peaks - the spectrum (`[mz, intensity]`) or a unit spectrum
 * @param options - see {@link FindMolecularIonOptions}
 */
export function findMolecularIon(
  peaks: readonly Peak[] | UnitSpectrum,
  options: FindMolecularIonOptions = {},
): MolecularIonCandidate | null {
  const { minRelative = 0.5, lossMinRelative = 5, minConfidence = 0.2 } = options;
  if (!(lossMinRelative >= 0)) throw new RangeError('lossMinRelative must be >= 0');
  if (!(minConfidence >= 0 && minConfidence <= 1)) throw new RangeError('minConfidence must be between 0 and 1');
  const unit = Array.isArray(peaks) ? toUnitSpectrum(peaks as Peak[]) : (peaks as UnitSpectrum);
  const [cluster] = findIsotopeClusters(unit, { minRelative, minMembers: 1 });
  if (!cluster) return null;

  const mz = cluster.mz;
  const relative = unit.intensities.get(mz) ?? 0;
  const reasons: string[] = [];
  let confidence = 1;
  reasons.push(`m/z ${mz} is the lightest member of the highest-mass significant cluster`);

  const { Cl, Br, fit } = cluster.halogens;
  if (cluster.members.length > 1) {
    const label = Cl + Br === 0 ? 'no Cl or Br' : `${Cl ? `Cl${Cl}` : ''}${Br ? `Br${Br}` : ''}`;
    reasons.push(`its cluster fits ${label} (fit ${fit.toFixed(4)})`);
    if (fit > 0.005) {
      confidence *= 0.8;
      reasons.push('the cluster fit is loose');
    }
  }

  if (relative < 1) {
    confidence *= 0.7;
    reasons.push(`M is weak (${relative.toFixed(2)} % of the base peak)`);
  } else if (relative < 5) {
    confidence *= 0.9;
    reasons.push(`M is small (${relative.toFixed(1)} % of the base peak)`);
  }

  const threshold = Math.max(lossMinRelative, relative / 10);
  const unusual = unit.masses.filter(
    (x) => x < mz && isUnusualLoss(mz - x) && (unit.intensities.get(x) ?? 0) >= threshold,
  );
  for (const x of unusual.reverse().slice(0, 3)) {
    confidence *= 0.6;
    reasons.push(
      `m/z ${x} would mean an unusual loss of ${mz - x} u from m/z ${mz}: m/z ${mz} may be a fragment or an impurity`,
    );
  }
  if (unusual.length === 0) reasons.push('no peak below implies an unusual loss (3–14 or 21–25 u)');

  if (confidence < minConfidence) return null;
  return { mz, relative, confidence: Math.round(confidence * 1000) / 1000, reasons, cluster };
}
