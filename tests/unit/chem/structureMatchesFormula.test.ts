import { describe, expect, it } from 'vitest';

import { structureMatchesFormula } from '@/lib/chem';

describe('structureMatchesFormula', () => {
  it('matches toluene with C7H8', () => {
    const result = structureMatchesFormula('Cc1ccccc1', 'CH3C6H5');
    expect(result.matches).toBe(true);
    expect(result.differences).toEqual({});
    expect(result.structureIhd).toBe(4);
    expect(result.formulaIhd).toBe(4);
  });

  it('reports a mismatch with the differing atoms', () => {
    const result = structureMatchesFormula('Cc1ccccc1', 'C7H10');
    expect(result.matches).toBe(false);
    expect(result.differences).toEqual({ H: 2 });
    expect(result.notes[0]).toMatch(/C7H8/);
  });

  // common practice, no source: dimethyl sulfone IHD 2 from the drawn structure, 0 from the formula
  it('matches a sulfone although the IHD values differ', () => {
    const result = structureMatchesFormula('CS(=O)(=O)C', 'C2H6O2S');
    expect(result.matches).toBe(true);
    expect(result.structureIhd).toBe(2);
    expect(result.formulaIhd).toBe(0);
    expect(result.notes[0]).toMatch(/hypervalent/);
  });
});
