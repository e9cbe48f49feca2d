import { commonFragmentIons, type FragmentIonComposition } from './commonFragmentIons';
import { toUnitSpectrum, type UnitSpectrum } from './toUnitSpectrum';
import type { Peak } from './types';

export interface AnnotateFragmentsOptions {
  /**
   * Peaks below this relative intensity (base peak = 100) are not annotated.
   * @default 2
   */
  minRelative?: number;
}

export interface FragmentAnnotation {
  mz: number;
  /** relative intensity (base peak = 100) */
  relative: number;
  /** the likely compositions joined with " or " */
  composition: string;
  ions: FragmentIonComposition[];
}

const byMz = new Map(commonFragmentIons.map((entry) => [entry.mz, entry]));

/**
 * Marks the peaks that are common EI fragment ions (see `commonFragmentIons`),
 * in ascending m/z.
 * @param peaks - the spectrum (`[mz, intensity]`) or a unit spectrum
 * @param options - see {@link AnnotateFragmentsOptions}
 */
export function annotateFragments(
  peaks: readonly Peak[] | UnitSpectrum,
  options: AnnotateFragmentsOptions = {},
): FragmentAnnotation[] {
  const { minRelative = 2 } = options;
  if (!(minRelative >= 0 && minRelative <= 100)) throw new RangeError('minRelative must be between 0 and 100');
  const unit = Array.isArray(peaks) ? toUnitSpectrum(peaks as Peak[]) : (peaks as UnitSpectrum);
  const annotations: FragmentAnnotation[] = [];
  for (const mz of unit.masses) {
    const relative = unit.intensities.get(mz) ?? 0;
    const entry = byMz.get(mz);
    if (!entry || relative < minRelative) continue;
    annotations.push({ mz, relative, composition: entry.ions.map((i) => i.formula).join(' or '), ions: entry.ions });
  }
  return annotations;
}
