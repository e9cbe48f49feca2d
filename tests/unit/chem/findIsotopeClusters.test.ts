import { describe, expect, it } from 'vitest';

import { findIsotopeClusters } from '@/lib/chem';

import { chlorobenzene, chloroform, toluene } from './referenceSpectra';

describe('findIsotopeClusters', () => {
  // clusters built from isotopic-distribution (IUPAC CIAAW compositions), see referenceSpectra.ts
  it('finds the Cl3 molecular-ion cluster and the Cl2 and Cl1 fragment clusters of chloroform', () => {
    const clusters = findIsotopeClusters(chloroform);
    const byMz = new Map(clusters.map((c) => [c.mz, c]));
    expect(byMz.get(118)?.halogens).toMatchObject({ Cl: 3, Br: 0 });
    expect(byMz.get(83)?.halogens).toMatchObject({ Cl: 2, Br: 0 });
    expect(byMz.get(47)?.halogens).toMatchObject({ Cl: 1, Br: 0 });
    expect(clusters[0].mz).toBe(118);
  });

  it('starts the chlorobenzene cluster at 112, not at its M+2 peak', () => {
    const [top] = findIsotopeClusters(chlorobenzene);
    expect(top.mz).toBe(112);
    expect(top.members.map((m) => m.mz)).toEqual(expect.arrayContaining([112, 113, 114, 115]));
    expect(top.halogens).toMatchObject({ Cl: 1, Br: 0 });
  });

  // common practice, no source: in toluene, 92 is M and 91 (C7H7+) a separate ion, not an isotope
  it('separates toluene M (92) from the C7H7+ ion (91)', () => {
    const clusters = findIsotopeClusters(toluene);
    expect(clusters[0].mz).toBe(92);
    expect(clusters[0].members.map((m) => m.mz)).toEqual([92, 93]);
  });

  it('rejects bad input', () => {
    expect(() => findIsotopeClusters([])).toThrow(RangeError);
    expect(() => findIsotopeClusters(toluene, { minMembers: 0 })).toThrow(RangeError);
  });
});
