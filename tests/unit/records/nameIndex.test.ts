import { describe, expect, it } from 'vitest';
import { buildNameIndex } from '../../../src/lib/records/nameIndex';

const rows = [
  { versionId: 1, name: 'Toluene', synonyms: ['methylbenzene'], casRegistryNo: '108-88-3' },
  { versionId: 2, name: 'Benzene', synonyms: [], casRegistryNo: '71-43-2' },
  { versionId: 3, name: 'Chlorobenzene', synonyms: ['phenyl chloride'], casRegistryNo: '108-90-7' },
  { versionId: 4, name: 'Ethyl acetate', synonyms: ['ethyl ethanoate'], casRegistryNo: '141-78-6' },
];

describe('buildNameIndex', () => {
  const index = buildNameIndex(rows);

  it('finds a name from a misspelling ("tolune" finds toluene)', () => {
    expect(index.search('tolune')[0].versionId).toBe(1);
  });

  it('finds a record by a synonym and says which synonym matched', () => {
    const [first] = index.search('ethyl ethanoate');
    expect(first).toMatchObject({ versionId: 4, matchedSynonym: 'ethyl ethanoate' });
  });

  it('ranks the exact name first', () => {
    expect(index.search('benzene')[0].versionId).toBe(2);
  });

  it('matches a CAS registry number exactly, not fuzzily', () => {
    expect(index.search('108-90-7').map((m) => m.versionId)).toEqual([3]);
    expect(index.search('108-90-8')).toEqual([]);
  });

  it('finds nothing for unrelated text or an empty query', () => {
    expect(index.search('zzqxv')).toEqual([]);
    expect(index.search('  ')).toEqual([]);
  });

  it('rejects a threshold outside 0..1', () => {
    expect(() => buildNameIndex(rows, { threshold: 2 })).toThrow(RangeError);
  });
});
