import { fromJSON } from 'convert-to-jcamp';
import { describe, expect, it } from 'vitest';

import { readJcamp, type ParsedSpectrum, type ReadJcampResult } from '@/lib/spectra/index';

import { BENZENE_REGION_BARS, fixture } from './helpers';

// Fixtures: tests/fixtures/jcamp, written from McDonald and Wilks, Appl. Spectrosc.
// 42 (1988) 151 (core, ASDF) and Lampen et al., Appl. Spectrosc. 48 (1994) 1545 (MS, NTUPLES).

function read(text: string, options = {}): { spectra: ParsedSpectrum[]; result: Extract<ReadJcampResult, { ok: true }> } {
  const result = readJcamp(text, options);
  if (!result.ok) throw new Error(`rejected: ${result.error}`);
  return { spectra: result.spectra, result };
}

function rejection(text: string, options = {}): string {
  const result = readJcamp(text, options);
  if (result.ok) throw new Error('expected a rejection');
  expect(result.error.length).toBeGreaterThan(10);
  return result.error;
}

describe('readJcamp: peak tables', () => {
  it('reads an (XY..XY) table with its metadata, comments and ";" separators', () => {
    const { spectra, result } = read(fixture('peak-table-xy.jdx'), { fileName: 'peak-table-xy.jdx' });
    expect(result.blocksFound).toBe(1);
    expect(result.warnings).toEqual([]);
    expect(spectra).toHaveLength(1);
    const [s] = spectra;
    expect(s.peaks).toEqual([
      [39, 120], [50, 160], [51, 185], [52, 195], [63, 30], [74, 45], [76, 60], [77, 250], [78, 999],
    ]);
    expect(s).toMatchObject({
      title: 'Benzene, reference standard lot 7',
      names: ['Benzene', 'Cyclohexatriene', 'Benzol'],
      formula: 'C6H6',
      casRegistryNo: '71-43-2',
      mw: 78,
      origin: 'Harbour Street Analytical (invented)',
      owner: 'M. Okafor',
      spectrometer: 'Quadrupole GC-MS, bench 2',
      ionizationMode: 'EI+',
      ionizationEnergy: 70,
      retentionIndex: 657,
      retentionTime: null,
      page: null,
      dataForm: 'peak table',
      userLabels: { Column: '5% phenyl polysiloxane, 30 m' },
    });
    expect(s.fieldsRead).toEqual(expect.arrayContaining(['TITLE', 'MOLFORM', 'CAS REGISTRY NO', '.IONIZATION ENERGY', '$RETENTION INDEX', 'PEAK TABLE']));
  });

  it('reads an (XYW..XYW) table with several groups a line, factors, and labels spelt loosely', () => {
    // jcampconverter alone reads this table as pairs: (51, 5), (5, 770), ...
    const { spectra } = read(fixture('peak-table-xyw.jdx'));
    expect(spectra[0].peaks).toEqual([[51, 100], [77, 600], [112, 1000], [113, 34], [114, 320], [115, 10]]);
    expect(spectra[0]).toMatchObject({
      title: 'Chlorobenzene',
      formula: 'C6H5Cl',
      casRegistryNo: '108-90-7',
      mw: 112.56,
      ionizationMode: 'EI+',
      ionizationEnergy: 70, // from the $ label "electron energy"
      userLabels: {},
    });
  });

  it('skips peaks with a "?" value and says so', () => {
    const { spectra, result } = read(fixture('missing-values.jdx'));
    expect(spectra[0].peaks).toEqual([[31, 999], [46, 300], [47, 12]]);
    expect(spectra[0]).toMatchObject({ origin: null, owner: null, mw: null });
    expect(spectra[1].peaks).toEqual([[29, 80], [31, 999], [33, 40]]);
    expect(result.warnings.map((w) => w.code)).toEqual(['missing_value', 'missing_value']);
  });

  it('merges a repeated m/z, with a warning', () => {
    const text = fixture('peak-table-xy.jdx').replace('##NPOINTS= 9\n', '').replace('39, 120', '39, 120 39, 5');
    const { spectra, result } = read(text);
    expect(spectra[0].peaks[0]).toEqual([39, 125]);
    expect(result.warnings.map((w) => w.code)).toContain('duplicate_mz');
  });
});

describe('readJcamp: XYDATA', () => {
  it.each([
    ['xydata-affn.jdx'],
    ['xydata-pac.jdx'],
    ['xydata-sqz.jdx'],
    ['xydata-sqzdup.jdx'],
    ['xydata-dif.jdx'],
    ['xydata-difdup.jdx'],
  ])('reads unit-spaced %s as bars, every non-zero point a peak', (name) => {
    const { spectra, result } = read(fixture(name));
    expect(result.warnings).toEqual([]);
    expect(spectra).toHaveLength(1);
    expect(spectra[0].dataForm).toBe('xydata bars');
    expect(spectra[0].peaks).toEqual(BENZENE_REGION_BARS);
  });

  it('reads AFFN E exponents (jcampconverter reads E as the SQZ digit +5)', () => {
    const { spectra } = read(fixture('xydata-affn-exponent.jdx'));
    expect(spectra[0].peaks).toEqual([[40, 150], [41, 25], [43, 0.4], [44, 999]]);
  });

  it('centroids finely spaced profile data', () => {
    const { spectra } = read(fixture('xydata-profile.jdx'));
    const [s] = spectra;
    expect(s.dataForm).toBe('profile centroided');
    expect(s.peaks).toHaveLength(3);
    // symmetric triangles centre on their apex; the third is (51.9*30 + 52*90 + 52.1*60) / 180
    const expected = [[50, 220], [51, 280], [9363 / 180, 180]];
    s.peaks.forEach(([mz, intensity], i) => {
      expect(mz).toBeCloseTo(expected[i][0], 9);
      expect(intensity).toBeCloseTo(expected[i][1], 9);
    });
  });

  // convert-to-jcamp (npm) is an encoder this project did not write: its
  // output in every form must read back to the same bars
  it.each(['FIX', 'CSV', 'PAC', 'SQZ', 'DIF', 'DIFDUP'] as const)('reads what convert-to-jcamp writes in %s', (form) => {
    const x = Array.from({ length: 40 }, (_, i) => 30 + i);
    const y = x.map((mz) => (mz % 3 === 0 ? 0 : (mz * 37) % 500));
    const text = fromJSON({ x, y }, { info: { title: 'encoded', dataType: 'MASS SPECTRUM' }, xyEncoding: form });
    const { spectra } = read(text);
    expect(spectra[0].peaks).toEqual(x.map((mz, i) => [mz, y[i]]).filter(([, v]) => v !== 0));
  });

  it('treats points spaced more than 1 apart as bars, with a warning', () => {
    const text = fixture('xydata-affn.jdx')
      .replace('##LASTX= 52', '##LASTX= 67')
      .replace('##DELTAX= 1', '##DELTAX= 2')
      .replace('45 5 0', '53 5 0');
    const { spectra, result } = read(text);
    expect(spectra[0].peaks[1]).toEqual([39, 27.5]);
    expect(result.warnings.map((w) => w.code)).toContain('coarse_spacing');
  });
});

describe('readJcamp: NTUPLES and compound files', () => {
  it('reads each NTUPLES page as a spectrum with its page number and retention time', () => {
    const { spectra, result } = read(fixture('ntuples-run.jdx'));
    expect(result.blocksFound).toBe(1);
    expect(spectra.map((s) => [s.page, s.retentionTime, s.dataForm])).toEqual([
      [1, 61.5, 'ntuples'],
      [2, 97, 'ntuples'],
      [3, 142.25, 'ntuples'],
    ]);
    expect(spectra[0].peaks).toEqual([[15, 200], [42, 80], [43, 999], [58, 270]]);
    expect(spectra[1].peaks).toEqual([[65, 90], [91, 999], [92, 620]]);
    expect(spectra[2].peaks).toEqual([[51, 120], [77, 420], [91, 999], [105, 300], [106, 610]]);
    for (const s of spectra) {
      expect(s).toMatchObject({ ionizationEnergy: 70, ionizationMode: 'EI+', title: 'GC-MS run 2291, solvent check mixture' });
    }
  });

  it('applies the NTUPLES ##FACTOR= per variable', () => {
    const text = fixture('ntuples-run.jdx').replace('##FACTOR= 1, 1, 1, 1', '##FACTOR= 0.5, 10, 1, 1');
    const { spectra } = read(text);
    expect(spectra[1].peaks).toEqual([[32.5, 900], [45.5, 9990], [46, 6200]]);
  });

  it('reads the blocks of a LINK file, inheriting ORIGIN and OWNER where a block has none', () => {
    const { spectra, result } = read(fixture('link-compound.jdx'));
    expect(result.blocksFound).toBe(3);
    expect(spectra).toHaveLength(2);
    expect(spectra[0]).toMatchObject({
      title: 'Toluene',
      names: ['Toluene', 'Methylbenzene'],
      formula: 'C7H8',
      retentionIndex: 763,
      owner: 'J. Lindqvist',
      origin: 'Harbour Street Analytical (invented)',
      peaks: [[39, 40], [65, 90], [91, 999], [92, 640]],
    });
    expect(spectra[1]).toMatchObject({
      title: 'Acetone',
      formula: 'C3H6O',
      owner: 'R. Baptiste',
      peaks: [[15, 230], [42, 70], [43, 999], [58, 290]],
    });
  });

  it('reads Latin-1 and UTF-8 with BOM and CRLF alike', () => {
    const latin1 = read(fixture('latin1-crlf.jdx')).spectra;
    const utf8 = read(fixture('utf8-bom-crlf.jdx')).spectra;
    expect(latin1).toEqual(utf8);
    expect(latin1[0]).toMatchObject({ title: 'Acétone, étalon de référence', owner: 'Hélène Müller', names: ['Acétone', 'Propan-2-one'] });
    // text given with CR LF directly is read the same
    expect(read(fixture('peak-table-xy.jdx').replace(/\n/g, '\r\n')).spectra).toEqual(read(fixture('peak-table-xy.jdx')).spectra);
  });

  it('skips a block that is not a mass spectrum, with a warning', () => {
    const ir = '##TITLE= an IR block\n##JCAMP-DX= 4.24\n##DATA TYPE= INFRARED SPECTRUM\n##PEAK TABLE= (XY..XY)\n1000, 5\n##END=\n';
    const { spectra, result } = read(`${ir}${fixture('peak-table-xy.jdx')}`);
    expect(spectra).toHaveLength(1);
    expect(result.blocksFound).toBe(2);
    expect(result.warnings.map((w) => w.code)).toEqual(['not_mass_spectrum']);
  });
});

describe('readJcamp: bad input is rejected with a clear message', () => {
  const xy = fixture('peak-table-xy.jdx');
  const dif = fixture('xydata-dif.jdx');
  const affn = fixture('xydata-affn.jdx');
  const ntuples = fixture('ntuples-run.jdx');
  const link = fixture('link-compound.jdx');

  it.each<[string, () => string, RegExp]>([
    ['an empty file', () => '', /empty/],
    ['binary garbage', () => String.fromCharCode(...Array.from({ length: 400 }, (_, i) => (i * 73) % 256)), /binary/],
    ['a PNG header', () => '\u0089PNG\r\n\u001a\n\u0000\u0000\u0000\rIHDR', /binary/],
    ['text that is not JCAMP-DX', () => 'mass,intensity\n78,999\n77,250\n', /not a JCAMP-DX file/],
    ['a first label other than TITLE', () => xy.replace('##TITLE= Benzene, reference standard lot 7 $$ synthetic test data\n', ''), /first label is ##JCAMP-DX=/],
    ['no ##JCAMP-DX= label', () => xy.replace(/##JCAMP-DX=.*\n/, ''), /no ##JCAMP-DX= label/],
    ['a missing ##END=', () => xy.replace('##END=\n', ''), /missing ##END=.*truncated/],
    ['a truncated file', () => dif.slice(0, dif.indexOf('44@N') + 6), /missing ##END=.*truncated/],
    ['a label line without "="', () => xy.replace('##MW= 78', '##MW 78'), /line 12: a label line without "="/],
    ['a duplicate label', () => xy.replace('##MW= 78', '##MW= 78\n##M_W= 79'), /duplicate label ##M_W= at lines 12 and 13/],
    ['a duplicate data record', () => xy.replace('##END=', '##PEAK TABLE= (XY..XY)\n1, 1\n##END='), /duplicate label ##PEAK TABLE=/],
    ['NPOINTS contradicting a peak table', () => xy.replace('##NPOINTS= 9', '##NPOINTS= 10'), /NPOINTS= says 10 peaks but the table holds 9/],
    ['NPOINTS contradicting XYDATA', () => affn.replace('##NPOINTS= 16', '##NPOINTS= 17').replace('##DELTAX= 1\n', ''), /NPOINTS= says 17 points .* holds 16/],
    ['DELTAX contradicting the X range', () => affn.replace('##DELTAX= 1', '##DELTAX= 0.5'), /DELTAX= 0.5 contradicts/],
    ['an X at a line start off FIRSTX + i * DELTAX', () => affn.replace('\n45 5 0', '\n46 5 0'), /line 18: the X at the line start is 46 but FIRSTX \+ 8 \* DELTAX is 45/],
    ['a failed DIF Y-check', () => dif.replace('44@Nn', '44A@Nn'), /DIF Y-check failed/],
    ['a corrupted DIF digit (caught by the Y-check)', () => dif.replace('K2J30', 'K3J30'), /line 19: DIF Y-check failed: the first Y is 195 but the previous line ended with 196/],
    ['NaN in a peak table', () => xy.replace('63, 30', '63, NaN'), /"NaN" is not a number/],
    ['Infinity in a peak table', () => xy.replace('63, 30', '63, Infinity'), /"Infinity" is not a number/],
    ['an overflowing number', () => xy.replace('63, 30', `63, 1e999`), /not a finite number/],
    ['a value that overflows with its factor', () => xy.replace('##YFACTOR= 1', '##YFACTOR= 1e300').replace('63, 30', '63, 1e300'), /intensity times its factor is not finite/],
    ['a non-numeric header value', () => affn.replace('##FIRSTX= 37', '##FIRSTX= thirty-seven'), /##FIRSTX= "thirty-seven" is not a number/],
    ['a zero m/z', () => xy.replace('39, 120', '0, 120'), /m\/z 0 is not positive/],
    ['a negative m/z', () => xy.replace('39, 120', '-39, 120'), /m\/z -39 is not positive/],
    ['a negative intensity', () => xy.replace('39, 120', '39, -120'), /negative intensity -120 at m\/z 39/],
    ['bars at m/z 0', () => affn.replace(/##FIRSTX= 37/, '##FIRSTX= -15').replace('##LASTX= 52', '##LASTX= 0').replace('37 40', '-15 40').replace('\n45 5', '\n-7 5'), /m\/z -15 is not positive/],
    ['an unpaired value', () => xy.replace('39, 120 50', '39, 120, 50'), /the group "39, 120, 50, 160" does not have the 2 values of \(XY..XY\)/],
    ['an unsupported table form', () => xy.replace('(XY..XY)', '(XYM..XYM)'), /"\(XYM..XYM\)" is not supported/],
    ['an NTUPLES section without its end', () => ntuples.replace('##END NTUPLES= MASS SPECTRUM\n', ''), /NTUPLES section that starts at line 11 has no ##END NTUPLES=/],
    ['an NTUPLES page in an unsupported form', () => ntuples.replace('##DATA TABLE= (XY..XY), PEAKS\n65', '##DATA TABLE= (X++(Y..Y)), XYDATA\n65'), /must hold peak tables/],
    ['BLOCKS contradicting the blocks found', () => link.replace('##BLOCKS= 2', '##BLOCKS= 3'), /##BLOCKS= says 3 blocks but .* holds 2/],
    ['a label after the last ##END=', () => `${xy}##TITLE2= x\n`.replace('##TITLE2', '##OWNER'), /after the last ##END=, outside any block/],
    ['a control character in the text', () => xy.replace('Benzol', 'Ben\u0007zol'), /line 9: a control character \(U\+0007\)/],
    ['a file with no mass spectrum', () => '##TITLE= x\n##JCAMP-DX= 5.01\n##DATA TYPE= INFRARED SPECTRUM\n##PEAK TABLE= (XY..XY)\n1000, 5\n##END=\n', /no mass spectrum found/],
    ['a spectrum without peaks', () => xy.replace('##NPOINTS= 9\n', '').replace(/##PEAK TABLE= \(XY..XY\)\n[\s\S]*?##END=/, '##PEAK TABLE= (XY..XY)\n39, 0\n##END='), /has no peaks with an intensity above zero/],
  ])('%s', (_name, make, message) => {
    expect(rejection(make())).toMatch(message);
  });

  it('more than 100,000 peaks in one spectrum', () => {
    const pairs = Array.from({ length: 100_001 }, (_, i) => `${1 + i * 0.01}, 1`).join('\n');
    const text = `##TITLE= big\n##JCAMP-DX= 5.01\n##DATA TYPE= MASS SPECTRUM\n##PEAK TABLE= (XY..XY)\n${pairs}\n##END=\n`;
    expect(rejection(text)).toMatch(/100001 peaks is more than the limit of 100000/);
    // exactly at the limit is fine
    const atLimit = text.replace(/\n[^\n]*\n##END=/, '\n##END=');
    expect(read(atLimit).spectra[0].peaks).toHaveLength(100_000);
  });

  it('more centroided or bar peaks than the limit', () => {
    expect(rejection(affn, { maxPeaks: 5 })).toMatch(/10 peaks is more than the limit of 5/);
  });

  it('a file name with a path separator or a control character', () => {
    expect(rejection(xy, { fileName: '../x.jdx' })).toMatch(/path separator/);
    expect(rejection(xy, { fileName: 'x\u0001.jdx' })).toMatch(/control character/);
  });

  it('checks its options', () => {
    expect(() => readJcamp(xy, { maxPeaks: 0 })).toThrow(RangeError);
    expect(() => readJcamp(xy, { unitSpacingTolerance: 0.7 })).toThrow(RangeError);
  });
});

describe('readJcamp: size', () => {
  it('reads 200,000 profile points and centroids them', () => {
    // 2,000 m/z units at 0.01 spacing, one triangle peak per unit
    const n = 200_000;
    const y = Array.from({ length: n }, (_, i) => Math.max(0, 50 - Math.abs((i % 100) - 50)) * 10);
    const lines: string[] = [];
    for (let i = 0; i < n; i += 10) lines.push(`${(1 + i * 0.01).toFixed(2)} ${y.slice(i, i + 10).join(' ')}`);
    const text = [
      '##TITLE= long profile', '##JCAMP-DX= 5.01', '##DATA TYPE= MASS SPECTRUM',
      '##XFACTOR= 1', '##YFACTOR= 1', '##FIRSTX= 1', `##LASTX= ${1 + (n - 1) * 0.01}`, `##NPOINTS= ${n}`,
      '##XYDATA= (X++(Y..Y))', ...lines, '##END=', '',
    ].join('\n');
    const result = readJcamp(text);
    if (!result.ok) throw new Error(result.error);
    const { peaks, dataForm } = result.spectra[0];
    expect(dataForm).toBe('profile centroided');
    expect(peaks).toHaveLength(2000);
    expect(peaks[0][0]).toBeCloseTo(1.5, 9);
    expect(peaks[1999][0]).toBeCloseTo(2000.5, 6);
  });
});
