import { describe, expect, it } from 'vitest';
import { buildListWhere } from '../../../src/lib/records/buildListWhere';
import { effectiveSort, spectraListQuerySchema } from '../../../src/lib/records/listQuery';

const parse = (q: Record<string, string>) => spectraListQuerySchema.parse(q);

describe('spectraListQuerySchema', () => {
  it('reads lists, numbers and defaults from query strings', () => {
    const q = parse({ elements: 'Cl, Br', ihdMin: '4', massMax: '200', tags: 'solvent,aromatic', page: '2' });
    expect(q).toMatchObject({ elements: ['Cl', 'Br'], ihdMin: 4, massMax: 200, tags: ['solvent', 'aromatic'], page: 2, pageSize: 25, status: [] });
  });
  it('refuses sort keys outside the allow-list and bad element symbols', () => {
    expect(spectraListQuerySchema.safeParse({ sort: 'peaks; DROP TABLE' }).success).toBe(false);
    expect(spectraListQuerySchema.safeParse({ elements: 'cl' }).success).toBe(false);
    expect(spectraListQuerySchema.safeParse({ pageSize: '1000' }).success).toBe(false);
  });
});

describe('effectiveSort', () => {
  it('is relevance when searching by name, name otherwise, and honours "-" for descending', () => {
    expect(effectiveSort({ q: 'tol' })).toEqual({ key: 'relevance', descending: false });
    expect(effectiveSort({})).toEqual({ key: 'name', descending: false });
    expect(effectiveSort({ sort: '-nominalMass' })).toEqual({ key: 'nominalMass', descending: true });
    expect(effectiveSort({ sort: 'relevance' })).toEqual({ key: 'name', descending: false });
  });
});

describe('buildListWhere', () => {
  it('selects the newest version among the asked statuses, released by default', () => {
    const w = buildListWhere(parse({}), []);
    expect(w.sql).toContain('v.status IN (?)');
    expect(w.sql).toContain('SELECT MAX(cv.version)');
    expect(w.params).toEqual([['released'], ['released']]);
  });
  it('adds one placeholder a filter value, never the value itself', () => {
    const w = buildListWhere(parse({ formula: 'CH3C6H5', elements: 'Cl', excludeElements: 'N', ihdMin: '1', tags: "it's" }), ['draft', 'released']);
    expect(w.sql).not.toContain("it's");
    // the formula compared in Hill order (mf-parser reads CH3C6H5 as C7H8)
    expect(w.params).toContainEqual(['C7H8', 'CH3C6H5']);
    expect(w.params).toEqual(expect.arrayContaining(['Cl', 'N', 1, "it's"]));
  });
  it('answers an unreadable formula with a 400', () => {
    expect(() => buildListWhere(parse({ formula: 'C6H6)' }), [])).toThrow(/formula/);
  });
});
