// The demo compounds: real structures whose stated formulas agree with what
// openchemlib reads from the SMILES (openchemlib is the reference here, not
// our code), registry numbers that pass their check digit, and the coverage
// the demo scenario promises.
import { describe, it, expect } from 'vitest';
import { Molecule } from 'openchemlib';
import { MF } from 'mf-parser';
import { DEMO_COMPOUNDS } from '../../../seeds/compounds';

const atoms = (mf: string) => {
  const a = new MF(mf).getInfo().atoms as Record<string, number>;
  return Object.fromEntries(Object.entries(a).filter(([, n]) => n > 0).sort(([x], [y]) => x.localeCompare(y)));
};

describe('demo compounds', () => {
  it('are at least 190, with unique names', () => {
    expect(DEMO_COMPOUNDS.length).toBeGreaterThanOrEqual(190);
    const names = DEMO_COMPOUNDS.map((c) => c.name.toLowerCase());
    expect(new Set(names).size).toBe(names.length);
  });

  it('state the formula that openchemlib derives from the SMILES, for every compound', () => {
    const mismatches: string[] = [];
    for (const c of DEMO_COMPOUNDS) {
      const fromSmiles = Molecule.fromSmiles(c.smiles).getMolecularFormula().formula;
      if (JSON.stringify(atoms(fromSmiles)) !== JSON.stringify(atoms(c.formula))) mismatches.push(`${c.name}: ${c.formula} vs ${fromSmiles}`);
    }
    expect(mismatches).toEqual([]);
  });

  it('carry registry numbers only in the CAS form with a valid check digit', () => {
    // CAS check digit: sum of the other digits weighted 1, 2, 3, … from the right, modulo 10 (the CAS registry's rule).
    for (const c of DEMO_COMPOUNDS.filter((x) => x.cas)) {
      expect(c.cas, c.name).toMatch(/^\d{2,7}-\d{2}-\d$/);
      const digits = c.cas!.replace(/-/g, '');
      const body = digits.slice(0, -1).split('').reverse();
      const sum = body.reduce((s, d, i) => s + (i + 1) * Number(d), 0);
      expect(sum % 10, `${c.name} ${c.cas}`).toBe(Number(digits.at(-1)));
    }
    // known pairs, from memory
    const cas = Object.fromEntries(DEMO_COMPOUNDS.filter((c) => c.cas).map((c) => [c.name, c.cas]));
    expect(cas.Benzene).toBe('71-43-2');
    expect(cas.Chloroform).toBe('67-66-3');
  });

  it('include the n-alkanes C6–C20 as a retention-index ladder (RI = 100·n by definition)', () => {
    for (let n = 6; n <= 20; n++) {
      const c = DEMO_COMPOUNDS.find((x) => x.formula === `C${n}H${2 * n + 2}` && x.smiles === 'C'.repeat(n));
      expect(c, `C${n}`).toBeDefined();
      expect(c!.ri).toBe(100 * n);
      expect(c!.tags).toContain('RI ladder');
    }
  });

  it('cover every class the scenario names, halogenated solvents and F and Si compounds', () => {
    const classes = new Set(DEMO_COMPOUNDS.map((c) => c.cls));
    for (const k of ['alkane', 'alkene', 'cycloalkane', 'aromatic', 'alcohol', 'ketone', 'aldehyde', 'acid', 'ester', 'ether', 'amine', 'amide', 'nitrile', 'nitro', 'N-heterocycle', 'sulfur', 'halogenated', 'fluorinated', 'organosilicon', 'TMS derivative'] as const) {
      expect(classes.has(k), k).toBe(true);
    }
    const names = new Set(DEMO_COMPOUNDS.map((c) => c.name));
    for (const n of ['Benzene', 'Toluene', 'p-Xylene', 'm-Xylene', 'o-Xylene', 'Naphthalene', 'Pyridine', 'Chlorobenzene', 'Dichloromethane', 'Chloroform', 'Carbon tetrachloride', 'Bromobenzene', 'Dibromomethane', 'Bromochloromethane', '1,2-Dibromoethane']) {
      expect(names.has(n), n).toBe(true);
    }
    expect(DEMO_COMPOUNDS.filter((c) => /F/.test(c.formula)).length).toBeGreaterThanOrEqual(5);
    expect(DEMO_COMPOUNDS.filter((c) => /Si/.test(c.formula)).length).toBeGreaterThanOrEqual(5);
  });

  it('give retention indices as plausible non-polar values for many compounds', () => {
    const withRi = DEMO_COMPOUNDS.filter((c) => c.ri !== undefined);
    expect(withRi.length).toBeGreaterThan(DEMO_COMPOUNDS.length / 2);
    for (const c of withRi) {
      expect(c.ri!, c.name).toBeGreaterThanOrEqual(300);
      expect(c.ri!, c.name).toBeLessThanOrEqual(3000);
    }
  });
});
