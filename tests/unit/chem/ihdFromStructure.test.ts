import { describe, expect, it } from 'vitest';

import { ihdFromFormula, ihdFromStructure, StructureError } from '@/lib/chem';

describe('ihdFromStructure', () => {
  // SMILES written from memory; IHD values as in ihdFromFormula.test.ts (common practice, no source)
  it.each([
    ['Cc1ccccc1', 'C7H8', 4],
    ['c1ccc2ccccc2c1', 'C10H8', 7],
    ['C1CCC=CC1', 'C6H10', 2],
    ['CC#C', 'C3H4', 2],
    ['CC(C)=O', 'C3H6O', 1],
    ['c1ccncc1', 'C5H5N', 4],
    ['CC#N', 'C2H3N', 2],
    ['CBr', 'CH3Br', 0],
    ['ClC(Cl)Cl', 'CHCl3', 0],
    ['Clc1ccccc1', 'C6H5Cl', 4],
    ['Cn1cnc2c1c(=O)n(C)c(=O)n2C', 'C8H10N4O2', 6],
  ])('%s (%s) has IHD %i, as its formula', (smiles, formula, ihd) => {
    const result = ihdFromStructure(smiles);
    expect(result.formula).toBe(formula);
    expect(result.ihd).toBe(ihd);
    expect(result.ihd).toBe(ihdFromFormula(formula).ihd);
  });

  it('counts a triple bond as two pi bonds and rings from the graph', () => {
    expect(ihdFromStructure('CC#N')).toMatchObject({ rings: 0, piBonds: 2 });
    expect(ihdFromStructure('c1ccc2ccccc2c1')).toMatchObject({ rings: 2, piBonds: 5 });
    expect(ihdFromStructure('C1CC1.C1CC1')).toMatchObject({ rings: 2, components: 2 });
  });

  it('reads a molfile', () => {
    const molfile = `
  handmade

  3  2  0  0  0  0  0  0  0  0999 V2000
    0.0000    0.0000    0.0000 C   0  0  0  0  0  0  0  0  0  0  0  0
    1.2000    0.0000    0.0000 C   0  0  0  0  0  0  0  0  0  0  0  0
    2.4000    0.0000    0.0000 C   0  0  0  0  0  0  0  0  0  0  0  0
  1  2  1  0
  2  3  3  0
M  END
`;
    expect(ihdFromStructure(molfile)).toMatchObject({ formula: 'C3H4', ihd: 2 });
  });

  // common practice, no source: drawn S=O bonds of a sulfone count as pi bonds
  it('keeps the drawn double bonds of hypervalent S', () => {
    expect(ihdFromStructure('CS(=O)(=O)C').ihd).toBe(2);
  });

  it('rejects unreadable structures', () => {
    expect(() => ihdFromStructure('C1CC(')).toThrow(StructureError);
    expect(() => ihdFromStructure('')).toThrow(RangeError);
  });
});
