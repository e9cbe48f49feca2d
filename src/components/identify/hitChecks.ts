// Checks on a hit list that the analyst should see at a glance: hits too close
// to the top to tell apart by the spectrum alone, and hits whose formula does
// not fit the molecular ion or halogen pattern read from the query.

export interface HitLike {
  rank: number;
  score: number;
  formula: string | null;
  nominalMass: number | null;
}

export interface InterpretationLike {
  molecularIon: { mz: number; confidence: number; reasons?: string[] } | null;
  halogenEstimate: { Cl: number; Br: number; fit: number; alternatives?: { Cl: number; Br: number; fit: number }[] } | null;
}

/**
 * Ranks of the hits within `margin` of the top score, when there are at least
 * two such hits (isomers often have near-identical EI spectra).
 * @param hits - the hit list
 * @param margin - score margin. @default 0.02
 */
export function closeToTop(hits: readonly HitLike[], margin = 0.02): Set<number> {
  if (!(margin >= 0)) throw new RangeError('margin must be >= 0');
  if (hits.length < 2) return new Set();
  const top = Math.max(...hits.map((h) => h.score));
  const close = hits.filter((h) => top - h.score <= margin + 1e-12);
  return close.length >= 2 ? new Set(close.map((h) => h.rank)) : new Set();
}

/**
 * Atom counts of a plain formula such as C6H5Cl or C2H4(OH)2 (one level of
 * brackets); null when it cannot be read.
 */
export function formulaCounts(formula: string | null | undefined): Record<string, number> | null {
  if (!formula) return null;
  const text = formula.replace(/\s+/g, '');
  if (!/^([A-Z][a-z]?\d*|\([A-Za-z\d]+\)\d*)+$/.test(text)) return null;
  const counts: Record<string, number> = {};
  const add = (part: string, factor: number) => {
    for (const m of part.matchAll(/([A-Z][a-z]?)(\d*)/g)) counts[m[1]] = (counts[m[1]] ?? 0) + (m[2] ? Number(m[2]) : 1) * factor;
  };
  let rest = text;
  for (const m of text.matchAll(/\(([A-Za-z\d]+)\)(\d*)/g)) {
    add(m[1], m[2] ? Number(m[2]) : 1);
    rest = rest.replace(m[0], '');
  }
  add(rest, 1);
  return counts;
}

export interface HitCheck {
  /** `contradiction`: the formula does not fit what the query shows; `note`: worth a look */
  kind: 'contradiction' | 'note';
  message: string;
}

/**
 * Compare a hit's formula with the query's interpretation.
 * @param hit - the hit (formula and nominal mass)
 * @param interpretation - the /api/interpret answer
 * @param options.goodFit - a halogen estimate with a fit below this is trusted. @default 0.05
 */
export function checkHitFormula(hit: HitLike, interpretation: InterpretationLike | null, options: { goodFit?: number } = {}): HitCheck[] {
  const { goodFit = 0.05 } = options;
  if (!interpretation) return [];
  const out: HitCheck[] = [];
  const m = interpretation.molecularIon;
  if (m && hit.nominalMass !== null) {
    const mz = Math.round(m.mz);
    if (hit.nominalMass !== mz) {
      out.push({
        kind: 'contradiction',
        message:
          hit.nominalMass > mz
            ? `formula mass ${hit.nominalMass} is above the molecular-ion candidate m/z ${mz} (unless M⁺ is missing from the query)`
            : `formula mass ${hit.nominalMass} is below the molecular-ion candidate m/z ${mz}`,
      });
    }
  }
  const counts = formulaCounts(hit.formula);
  const h = interpretation.halogenEstimate;
  if (m && h && counts && h.fit <= goodFit && hit.nominalMass === Math.round(m.mz)) {
    const cl = counts.Cl ?? 0;
    const br = counts.Br ?? 0;
    const fits = [h, ...(h.alternatives ?? [])].some((a) => a.Cl === cl && a.Br === br);
    if (!fits) {
      out.push({ kind: 'contradiction', message: `formula has Cl${cl} Br${br}; the isotope cluster at M suggests Cl${h.Cl} Br${h.Br}` });
    }
  }
  if (m && m.confidence < 0.5 && out.some((c) => c.kind === 'contradiction')) {
    out.push({ kind: 'note', message: `the molecular-ion candidate is uncertain (confidence ${m.confidence.toFixed(2)})` });
  }
  return out;
}
