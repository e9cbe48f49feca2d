export interface NitrogenRuleOptions {
  /**
   * `molecularIon` for the odd-electron M+•; `evenElectronFragment` for an
   * even-electron fragment ion, for which the rule is reversed.
   * @default 'molecularIon'
   */
  ion?: 'molecularIon' | 'evenElectronFragment';
}

export interface NitrogenRuleResult {
  nominalMass: number;
  parity: 'odd' | 'even';
  /** what the parity says about the number of nitrogen atoms */
  nitrogen: 'odd' | 'even or zero';
  note: string;
}

/**
 * Nitrogen rule: an odd-electron molecular ion of odd nominal mass has an odd
 * number of nitrogen atoms, of even mass an even number (or none). Even-electron
 * fragment ions reverse it. Phosphorus, although it counts like N for IHD, does
 * not change the parity.
 * @param mz - m/z of the ion (rounded to the nominal mass)
 * @param options - see {@link NitrogenRuleOptions}
 */
export function nitrogenRule(mz: number, options: NitrogenRuleOptions = {}): NitrogenRuleResult {
  const { ion = 'molecularIon' } = options;
  if (ion !== 'molecularIon' && ion !== 'evenElectronFragment') {
    throw new RangeError(`ion must be 'molecularIon' or 'evenElectronFragment', got ${String(ion)}`);
  }
  if (!Number.isFinite(mz) || mz <= 0) throw new RangeError(`mz must be a positive number, got ${mz}`);
  const nominalMass = Math.round(mz);
  const parity = nominalMass % 2 === 1 ? 'odd' : 'even';
  const oddNitrogen = (parity === 'odd') === (ion === 'molecularIon');
  const nitrogen = oddNitrogen ? 'odd' : 'even or zero';
  const note =
    ion === 'molecularIon'
      ? `an odd-electron molecular ion at nominal mass ${nominalMass} (${parity}) has ${nitrogen === 'odd' ? 'an odd number of' : 'an even number of (or no)'} nitrogen atoms; even-electron fragment ions reverse the rule`
      : `an even-electron fragment ion at nominal mass ${nominalMass} (${parity}) has ${nitrogen === 'odd' ? 'an odd number of' : 'an even number of (or no)'} nitrogen atoms`;
  return { nominalMass, parity, nitrogen, note };
}
