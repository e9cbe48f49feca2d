import { describe, expect, it } from 'vitest';

import { peakContentHash, readJcamp, writeJcamp, type JcampSpectrumInput, type ParsedSpectrum } from '@/lib/spectra/index';

import { fixture } from './helpers';

function readOne(text: string): ParsedSpectrum {
  const result = readJcamp(text);
  if (!result.ok) throw new Error(result.error);
  expect(result.spectra).toHaveLength(1);
  return result.spectra[0];
}

const metadataKeys = [
  'title', 'names', 'formula', 'casRegistryNo', 'mw', 'origin', 'owner', 'spectrometer',
  'ionizationMode', 'ionizationEnergy', 'retentionIndex', 'retentionTime', 'userLabels',
] as const;

const chlorobenzene: JcampSpectrumInput = {
  title: 'Chlorobenzene, lot 2024-11',
  names: ['Chlorobenzene', 'Phenyl chloride', 'Monochlorobenzene'],
  formula: 'C6H5Cl',
  casRegistryNo: '108-90-7',
  mw: 112.56,
  origin: 'Harbour Street Analytical (invented)',
  owner: 'J. Lindqvist',
  spectrometer: 'Quadrupole GC-MS, bench 2',
  ionizationMode: 'EI+',
  ionizationEnergy: 70,
  retentionIndex: 842.5,
  retentionTime: 411.25,
  userLabels: { 'SOURCE TEMPERATURE': '230 C', 'Reference standard purity': '99.8 %', Notes: 'two lines\nof notes' },
  // synthetic test intensities, with digits that a lossy writer would round away
  peaks: [[112, 1000], [114, 325.12345678901], [77, 612.3], [51, 141.0000001], [113, 66.6], [50, 1e-7], [115.0034, 21.75]],
};

describe('writeJcamp', () => {
  it('writes a JCAMP-DX 5.01 mass spectrum with a peak table and the metadata labels', () => {
    const text = writeJcamp(chlorobenzene);
    const lines = text.split('\n');
    expect(lines[0]).toBe('##TITLE=Chlorobenzene, lot 2024-11');
    expect(lines).toEqual(expect.arrayContaining([
      '##JCAMP-DX=5.01',
      '##DATA TYPE=MASS SPECTRUM',
      '##MOLFORM=C 6 H 5 Cl',
      '##CAS REGISTRY NO=108-90-7',
      '##MW=112.56',
      '##.IONIZATION MODE=EI+',
      '##.IONIZATION ENERGY=70',
      '##$RETENTION INDEX=842.5',
      '##PEAK TABLE=(XY..XY)',
      '##NPOINTS=7',
    ]));
    expect(text.endsWith('##END=\n')).toBe(true);
  });

  it('round trip: writeJcamp then readJcamp gives identical peaks and metadata', () => {
    const read = readOne(writeJcamp(chlorobenzene));
    for (const key of metadataKeys) expect(read[key]).toEqual(chlorobenzene[key]);
    expect(read.peaks).toEqual([...chlorobenzene.peaks].sort((a, b) => a[0] - b[0]));
    expect(read.dataForm).toBe('peak table');
    expect(peakContentHash(read.peaks)).toBe(peakContentHash(chlorobenzene.peaks));
  });

  it('round trip of every fixture spectrum that is read', () => {
    for (const name of ['peak-table-xy.jdx', 'peak-table-xyw.jdx', 'xydata-difdup.jdx', 'xydata-profile.jdx', 'link-compound.jdx', 'latin1-crlf.jdx']) {
      const result = readJcamp(fixture(name));
      if (!result.ok) throw new Error(result.error);
      for (const spectrum of result.spectra) {
        const again = readOne(writeJcamp(spectrum));
        for (const key of metadataKeys) expect(again[key], `${name} ${key}`).toEqual(spectrum[key]);
        expect(again.peaks).toEqual(spectrum.peaks);
      }
    }
  });

  it('writes absent metadata so that it reads back absent', () => {
    const read = readOne(writeJcamp({ title: 'bare', peaks: [[43, 999], [58, 10]] }));
    expect(read).toMatchObject({
      names: [], formula: null, casRegistryNo: null, mw: null, origin: null, owner: null,
      spectrometer: null, ionizationMode: null, ionizationEnergy: null, retentionIndex: null, userLabels: {},
    });
  });

  it('keeps text that JCAMP-DX cannot carry from breaking the file', () => {
    const text = writeJcamp({
      title: 'line one\nline two $$ not a comment',
      userLabels: { 'a=b': '##END= inside\n##TITLE= injected', RETENTIONINDEX: 'dropped duplicate' },
      retentionIndex: 700,
      peaks: [[43, 1]],
    });
    const read = readOne(text);
    expect(read.title).toBe('line one line two $ $ not a comment');
    expect(read.retentionIndex).toBe(700);
    expect(Object.keys(read.userLabels)).toEqual(['a b']);
  });

  it('rejects peaks that are not finite numbers', () => {
    expect(() => writeJcamp({ title: 'x', peaks: [[Number.NaN, 1]] })).toThrow(RangeError);
    expect(() => writeJcamp({ title: 'x', peaks: [[1, 1]], mw: Number.POSITIVE_INFINITY })).toThrow(RangeError);
  });
});
