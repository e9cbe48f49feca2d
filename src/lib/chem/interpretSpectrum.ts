import { annotateFragments, type FragmentAnnotation } from './annotateFragments';
import { annotateLosses } from './annotateLosses';
import { candidateFormulas, type ElementLimits } from './candidateFormulas';
import { estimateHalogens } from './estimateHalogens';
import { findIsotopeClusters, type IsotopeCluster } from './findIsotopeClusters';
import { findMolecularIon } from './findMolecularIon';
import { nitrogenRule, type NitrogenRuleResult } from './nitrogenRule';
import { toUnitSpectrum } from './toUnitSpectrum';
import type { HalogenFit, Peak } from './types';

export interface InterpretSpectrumOptions {
  /**
   * Peaks below this relative intensity (base peak = 100) are ignored.
   * @default 0.5
   */
  minRelative?: number;
  /**
   * Element limits for the candidate formulas.
   * @default the defaults of `candidateFormulas`
   */
  limits?: ElementLimits;
  /**
   * Most candidate formulas returned.
   * @default 20
   */
  candidateLimit?: number;
}

export interface SpectrumInterpretation {
  molecularIon: { mz: number; confidence: number; reasons: string[] } | null;
  isotopeClusters: IsotopeCluster[];
  halogenEstimate: (HalogenFit & { alternatives: HalogenFit[] }) | null;
  nitrogenRule: NitrogenRuleResult | null;
  losses: Array<{ fromMz: number; toMz: number; loss: number; composition: string }>;
  fragments: FragmentAnnotation[];
  candidateFormulas: Array<{ formula: string; ihd: number; isotopeFit: number | null }>;
}

/**
 * Interpretation of an EI spectrum as the interpretation panel shows it
 * (the `/api/interpret` answer): molecular-ion candidate, isotope clusters,
 * halogen estimate, nitrogen rule, losses from M, common fragment ions and
 * candidate formulas. Each item is a candidate for the analyst to judge.
 * @param peaks - `[mz, intensity]` pairs on any intensity scale
 * @param options - see {@link InterpretSpectrumOptions}
 * @throws {RangeError} for an empty peak list or invalid peaks
 */
export function interpretSpectrum(peaks: readonly Peak[], options: InterpretSpectrumOptions = {}): SpectrumInterpretation {
  const { minRelative = 0.5, limits, candidateLimit = 20 } = options;
  const unit = toUnitSpectrum(peaks);
  const isotopeClusters = findIsotopeClusters(unit, { minRelative });
  const molecularIon = findMolecularIon(unit, { minRelative });
  const fragments = annotateFragments(unit);
  if (!molecularIon) {
    return {
      molecularIon: null,
      isotopeClusters,
      halogenEstimate: null,
      nitrogenRule: null,
      losses: [],
      fragments,
      candidateFormulas: [],
    };
  }
  const m = molecularIon.mz;
  const estimate = estimateHalogens(unit, m);
  const observedCluster = Array.from({ length: 13 }, (_, k) => unit.intensities.get(m + k) ?? 0);
  const halogenEstimate = { Cl: estimate.Cl, Br: estimate.Br, fit: estimate.fit, alternatives: estimate.alternatives };
  // Alternatives stay in play: the candidates may carry any close halogen composition.
  const compositions = [halogenEstimate, ...estimate.alternatives];
  const candidates = compositions
    .flatMap((h) =>
      candidateFormulas(m, {
        limits,
        halogenEstimate: { Cl: h.Cl, Br: h.Br },
        observedCluster,
        limit: candidateLimit,
        // the whole interpretation stays inside about 150 ms
        timeBudgetMs: 120 / compositions.length,
      }),
    )
    .sort((a, b) => (a.isotopeFit ?? 0) - (b.isotopeFit ?? 0))
    .slice(0, candidateLimit)
    .map(({ formula, ihd, isotopeFit }) => ({ formula, ihd, isotopeFit }));
  return {
    molecularIon: { mz: molecularIon.mz, confidence: molecularIon.confidence, reasons: molecularIon.reasons },
    isotopeClusters,
    halogenEstimate,
    nitrogenRule: nitrogenRule(m),
    losses: annotateLosses(unit, m).map(({ fromMz, toMz, loss, composition }) => ({ fromMz, toMz, loss, composition })),
    fragments,
    candidateFormulas: candidates,
  };
}
