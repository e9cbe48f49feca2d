import { describe, expect, it } from 'vitest';
import { compileFilters, hillKey, riDelta, type EntryMeta } from '../../../src/lib/search/filters';

const meta: EntryMeta = {
  spectrumId: 1, recordId: 1, version: 1, name: 'chlorobenzene', formula: 'C6H5Cl', nominalMass: 112, ihd: 4,
  elements: ['C', 'H', 'Cl'], tags: ['solvent'], status: 'released', ri: [{ phase: 'non-polar', value: 850 }],
};

describe('filters', () => {
  it('compares formulas in Hill order', () => {
    expect(hillKey('ClC6H5')).toBe('C6H5Cl');
    expect(hillKey('OH2')).toBe('H2O');
    expect(compileFilters({ formula: 'H5C6Cl' })(meta)).toBe(1);
    expect(compileFilters({ formula: 'C6H6' })(meta)).toBe(0);
  });
  it('checks status (released by default), elements, ranges and tags', () => {
    expect(compileFilters({})({ ...meta, status: 'draft' })).toBe(0);
    expect(compileFilters({ status: ['draft'] })({ ...meta, status: 'draft' })).toBe(1);
    expect(compileFilters({ elements: ['Cl'], excludeElements: ['Br'] })(meta)).toBe(1);
    expect(compileFilters({ excludeElements: ['Cl'] })(meta)).toBe(0);
    expect(compileFilters({ ihdMin: 5 })(meta)).toBe(0);
    expect(compileFilters({ massMin: 100, massMax: 120 })(meta)).toBe(1);
    expect(compileFilters({ massMin: 100 })({ ...meta, nominalMass: null })).toBe(0);
    expect(compileFilters({ tags: ['solvent', 'impurity'] })(meta)).toBe(0);
  });
  it('treats an RI window as a hard filter, or as a penalty when one is given', () => {
    expect(compileFilters({ ri: { value: 900, window: 60, phase: 'non-polar' } })(meta)).toBe(1);
    expect(compileFilters({ ri: { value: 1000, window: 60, phase: 'non-polar' } })(meta)).toBe(0);
    expect(compileFilters({ ri: { value: 1000, window: 60, phase: 'non-polar', penalty: 0.1 } })(meta)).toBe(2);
    expect(riDelta(meta, { ri: { value: 900, window: 60, phase: 'non-polar' } })).toBe(-50);
  });
  it('rejects malformed filters naming the field', () => {
    expect(() => compileFilters({ massMin: -1 })).toThrow(/massMin/);
    expect(() => compileFilters({ status: ['gone' as never] })).toThrow(/status/);
    expect(() => compileFilters({ ri: { value: 900, window: 10, phase: 'x', penalty: 2 } })).toThrow(/ri.penalty/);
  });
});
