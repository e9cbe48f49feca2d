import { describe, expect, it } from 'vitest';

import { averageMass, conventionalAtomicWeights } from '@/lib/chem';

import { ATOMIC_WEIGHT_INTERVAL, FORMULAS } from './massReference';

describe('averageMass', () => {
  // IUPAC CIAAW standard atomic weights (2021): intervals in massReference.ts
  it.each(FORMULAS)('%s lies within what the standard atomic-weight intervals allow', (formula, counts) => {
    let low = 0;
    let high = 0;
    for (const [symbol, n] of Object.entries(counts)) {
      low += n * ATOMIC_WEIGHT_INTERVAL[symbol][0];
      high += n * ATOMIC_WEIGHT_INTERVAL[symbol][1];
    }
    const mass = averageMass(formula);
    expect(mass).toBeGreaterThanOrEqual(low);
    expect(mass).toBeLessThanOrEqual(high);
  });

  // IUPAC CIAAW abridged standard atomic weights, conventional values (from memory)
  it('uses the conventional values', () => {
    expect(conventionalAtomicWeights.H).toBe(1.008);
    expect(conventionalAtomicWeights.Cl).toBe(35.45);
    expect(averageMass('H2O')).toBeCloseTo(2 * 1.008 + 15.999, 10);
    // from memory: caffeine 194.19 g/mol
    expect(averageMass('C8H10N4O2')).toBeCloseTo(194.19, 2);
  });
});
