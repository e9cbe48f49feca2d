// The import pipeline against the test database: every JCAMP-DX form end to
// end (each peak compared), duplicates, same peaks under another compound,
// near duplicates, NTUPLES page selection, warnings, rejected files.
// Fixture formats: McDonald and Wilks, Appl. Spectrosc. 42 (1988) 151 (core);
// Lampen et al., Appl. Spectrosc. 48 (1994) 1545 (mass spectra, NTUPLES).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import { importFile, runImport, confirmFile, getBatch, type Actor, type FileReport } from '../../../src/lib/curation';
import { readJcamp } from '../../../src/lib/spectra/readJcamp';
import { jsonValue } from '../../../src/lib/curation/versionRow';
import { decodeText } from '../../../src/lib/spectra/decodeText';
import {
  RUN, SPECTRA_FIXTURES, IMPORT_FIXTURES, createUser, uniqueCas, libraryCounts, fixture, peakTableFile, storedPeaks, expectPeaksEqual, rng, randomPeaks,
} from './helpers';

const sequelize = useTestDatabase();
afterAll(() => closeSequelize());

let curator: Actor;
beforeAll(async () => {
  curator = await createUser(sequelize, 'importer', ['curator']);
});

/**
 * Give a fixture's compounds names and registry numbers of this run, so rows
 * other test files made (the database is shared) are other compounds. The
 * same peaks may still be in the library under those: such a file needs
 * confirmation first (storeWhatever), and its warning is left out below.
 */
const casOf = new Map<string, string>();
function tokenized(bytes: Buffer): Buffer {
  const s = bytes
    .toString('latin1')
    .replace(/##(TITLE|title|NAMES)=\s?/g, (m) => `${m.trimEnd()} R${RUN} `)
    .replace(/##(CAS REGISTRY NO|cas registry no)=\s*(\S+)/g, (_m, label, cas) => {
      if (!casOf.has(cas)) casOf.set(cas, uniqueCas());
      return `##${label}= ${casOf.get(cas)}`;
    });
  return Buffer.from(s, 'latin1');
}
const codesOf = (r: FileReport) => r.warnings.map((w) => w.code).filter((c) => c !== 'same_peaks_other_compound');

async function importBytes(name: string, bytes: Buffer, pages?: 'all' | number[]): Promise<{ report: FileReport; batchId: string }> {
  const r = await runImport({ actor: curator, files: [{ name, bytes }], pages: pages ? { [name]: pages } : {} });
  return { report: r.files[0], batchId: r.batchId };
}

/** Store the file whatever the library already holds; returns the record ids holding its spectra. */
async function storeWhatever(name: string, bytes: Buffer): Promise<{ report: FileReport; ids: number[] }> {
  let { report, batchId } = await importBytes(name, bytes);
  if (report.status === 'needs_confirmation') report = await confirmFile(batchId, name, curator);
  if (report.status === 'duplicate') return { report, ids: [report.duplicateOf!] };
  expect(report.status, JSON.stringify(report)).toBe('imported');
  return { report, ids: report.spectra.map((s) => s.id) };
}

const BENZENE_REGION: [number, number][] = [
  // README of tests/fixtures/jcamp: raw Y 40 55 120 10 0 0 0 0 5 0 0 8 30 160 185 195 at m/z 37..52, YFACTOR 0.5
  [37, 20], [38, 27.5], [39, 60], [40, 5], [45, 2.5], [48, 4], [49, 15], [50, 80], [51, 92.5], [52, 97.5],
];

describe('each JCAMP-DX form, imported end to end', () => {
  it('peak table (XY..XY) with its metadata', async () => {
    const { report, ids } = await storeWhatever('peak-table-xy.jdx', tokenized(fixture(SPECTRA_FIXTURES, 'peak-table-xy.jdx')));
    expect(report.status).toBe('imported');
    expect(codesOf(report)).toEqual([]);
    expectPeaksEqual(await storedPeaks(sequelize, ids[0]), [[39, 120], [50, 160], [51, 185], [52, 195], [63, 30], [74, 45], [76, 60], [77, 250], [78, 999]]);
    const [v] = await sequelize.query<any>('SELECT * FROM spectrum_version WHERE recordId = ?', { replacements: [ids[0]], type: QueryTypes.SELECT });
    expect(v.name).toBe(`R${RUN} Benzene`);
    expect(jsonValue(v.synonyms, [])).toEqual(['Cyclohexatriene', 'Benzol']);
    expect(v.formula).toBe('C6H6');
    expect(v.nominalMass).toBe(78);
    expect(v.ihd).toBe(4);
    expect(v.casRegistryNo).toBe(casOf.get('71-43-2'));
    expect(v.ionizationEnergy).toBe(70);
    expect(v.ionizationMode).toBe('EI+');
    expect(v.instrument).toBe('Quadrupole GC-MS, bench 2');
    expect(v.status).toBe('draft');
    expect(v.createdBy).toBe(curator.id);
    const metadata = jsonValue<any>(v.metadata, {});
    expect(metadata.userLabels.Column).toBe('5% phenyl polysiloxane, 30 m');
    const ri = await sequelize.query<any>('SELECT value FROM retention_index WHERE spectrumVersionId = ?', { replacements: [v.id], type: QueryTypes.SELECT });
    expect(ri.map((r) => r.value)).toEqual([657]);
  });

  it('peak table (XYW..XYW) with XFACTOR, YFACTOR and lower-case labels', async () => {
    const { report, ids } = await storeWhatever('peak-table-xyw.jdx', tokenized(fixture(SPECTRA_FIXTURES, 'peak-table-xyw.jdx')));
    // x_factor 0.1, Y-FACTOR 2
    expectPeaksEqual(await storedPeaks(sequelize, ids[0]), [[51, 100], [77, 600], [112, 1000], [113, 34], [114, 320], [115, 10]]);
    expect(codesOf(report)).toEqual([]);
    const [v] = await sequelize.query<any>('SELECT formula, ionizationEnergy, casRegistryNo FROM spectrum_version WHERE recordId = ?', { replacements: [ids[0]], type: QueryTypes.SELECT });
    expect(v).toMatchObject({ formula: 'C6H5Cl', ionizationEnergy: 70, casRegistryNo: casOf.get('108-90-7') });
  });

  for (const form of ['affn', 'pac', 'sqz', 'dif', 'sqzdup', 'difdup']) {
    it(`XYDATA (X++(Y..Y)) in ${form.toUpperCase()} reads to the same ten bar peaks`, async () => {
      const { ids, report } = await storeWhatever(`xydata-${form}.jdx`, tokenized(fixture(SPECTRA_FIXTURES, `xydata-${form}.jdx`)));
      expectPeaksEqual(await storedPeaks(sequelize, ids[0]), BENZENE_REGION);
      expect(report.found[0].dataForm).toBe('xydata bars');
    });
  }

  it('XYDATA in AFFN with exponents', async () => {
    const { ids } = await storeWhatever('xydata-affn-exponent.jdx', tokenized(fixture(SPECTRA_FIXTURES, 'xydata-affn-exponent.jdx')));
    expectPeaksEqual(await storedPeaks(sequelize, ids[0]), [[40, 150], [41, 25], [43, 0.4], [44, 999]]);
  });

  it('profile XYDATA is centroided to three peaks', async () => {
    const bytes = tokenized(fixture(SPECTRA_FIXTURES, 'xydata-profile.jdx'));
    const { ids, report } = await storeWhatever('xydata-profile.jdx', bytes);
    const peaks = await storedPeaks(sequelize, ids[0]);
    expect(peaks.map(([mz]) => Math.round(mz))).toEqual([50, 51, 52]);
    const read = readJcamp(decodeText(bytes));
    if (!read.ok) throw new Error(read.error);
    expectPeaksEqual(peaks, read.spectra[0].peaks);
    expect(report.found[0].dataForm).toBe('profile centroided');
  });

  it('an NTUPLES run of three pages stores each page with its retention time', async () => {
    const { report, ids } = await storeWhatever('ntuples-run.jdx', tokenized(fixture(SPECTRA_FIXTURES, 'ntuples-run.jdx')));
    expect(report.pageCount).toBe(3);
    expect(ids).toHaveLength(3);
    expectPeaksEqual(await storedPeaks(sequelize, ids[0]), [[15, 200], [42, 80], [43, 999], [58, 270]]);
    expectPeaksEqual(await storedPeaks(sequelize, ids[1]), [[65, 90], [91, 999], [92, 620]]);
    expectPeaksEqual(await storedPeaks(sequelize, ids[2]), [[51, 120], [77, 420], [91, 999], [105, 300], [106, 610]]);
    const rts = await sequelize.query<any>('SELECT retentionTime FROM spectrum_version WHERE recordId IN (?) ORDER BY recordId', { replacements: [ids], type: QueryTypes.SELECT });
    expect(rts.map((r) => r.retentionTime)).toEqual([61.5, 97, 142.25]);
  });

  it('a LINK compound file stores each linked block with inherited ORIGIN', async () => {
    const { report, ids } = await storeWhatever('link-compound.jdx', tokenized(fixture(SPECTRA_FIXTURES, 'link-compound.jdx')));
    expect(ids).toHaveLength(2);
    expect(report.found.map((f) => f.name)).toEqual([`R${RUN} Toluene`, `R${RUN} Acetone`]);
    expectPeaksEqual(await storedPeaks(sequelize, ids[0]), [[39, 40], [65, 90], [91, 999], [92, 640]]);
    expectPeaksEqual(await storedPeaks(sequelize, ids[1]), [[15, 230], [42, 70], [43, 999], [58, 290]]);
    const rows = await sequelize.query<any>('SELECT origin, owner FROM spectrum_version WHERE recordId IN (?) ORDER BY recordId', { replacements: [ids], type: QueryTypes.SELECT });
    expect(rows[0]).toEqual({ origin: 'Harbour Street Analytical (invented)', owner: 'J. Lindqvist' });
    expect(rows[1].owner).toBe('R. Baptiste');
  });

  it('missing values ("?") are skipped in a peak table and in XYDATA', async () => {
    const { ids } = await storeWhatever('missing-values.jdx', tokenized(fixture(SPECTRA_FIXTURES, 'missing-values.jdx')));
    expectPeaksEqual(await storedPeaks(sequelize, ids[0]), [[31, 999], [46, 300], [47, 12]]);
    expectPeaksEqual(await storedPeaks(sequelize, ids[1]), [[29, 80], [31, 999], [33, 40]]);
  });

  it('UTF-8 with a BOM and CRLF, then the same spectrum in Latin-1, is a duplicate', async () => {
    const utf8 = await storeWhatever('utf8-bom-crlf.jdx', tokenized(fixture(SPECTRA_FIXTURES, 'utf8-bom-crlf.jdx')));
    expectPeaksEqual(await storedPeaks(sequelize, utf8.ids[0]), [[15, 230], [42, 70], [43, 999], [58, 290]]);
    const [v] = await sequelize.query<any>('SELECT name FROM spectrum_version WHERE recordId = ?', { replacements: [utf8.ids[0]], type: QueryTypes.SELECT });
    expect(v.name).toBe(`R${RUN} Acétone`);
    const before = await libraryCounts(sequelize);
    const { report } = await importBytes('latin1-crlf.jdx', tokenized(fixture(SPECTRA_FIXTURES, 'latin1-crlf.jdx')));
    expect(report.status).toBe('duplicate');
    expect(report.duplicateOf).toBe(utf8.ids[0]);
    expect(await libraryCounts(sequelize)).toEqual(before);
  });
});

describe('duplicates and look-alikes', () => {
  const next = rng(4242);

  it('the same compound with the same peaks is a duplicate, reported with the record id, not stored', async () => {
    const peaks = randomPeaks(next);
    const text = peakTableFile({ title: `Dup ${RUN}`, names: [`Dupline ${RUN}`], formula: 'C 8 H 10', peaks });
    const first = await importFile({ fileName: 'dup-a.jdx', bytes: Buffer.from(text), actor: curator });
    expect(first.report.status).toBe('imported');
    const before = await libraryCounts(sequelize);
    // scaled to 100 and written in another order: the same normalized, binned peaks
    const scaled = peaks.map(([mz, i]) => [mz, (i / 999) * 100] as [number, number]).reverse();
    const again = await importFile({ fileName: 'dup-b.jdx', bytes: Buffer.from(peakTableFile({ title: 'other title', names: [`  DUPLINE   ${RUN}`], formula: 'H10C8', peaks: scaled })), actor: curator });
    expect(again.report.status).toBe('duplicate');
    expect(again.report.duplicateOf).toBe(first.report.spectra[0].id);
    expect(again.report.spectra).toEqual([]);
    expect(await libraryCounts(sequelize)).toEqual(before);
  });

  it('the same formula and registry number under another name is the same compound', async () => {
    const peaks = randomPeaks(next);
    const a = await importFile({ fileName: 'cas-a.jdx', bytes: Buffer.from(peakTableFile({ title: `Cas A ${RUN}`, formula: 'C7H8', cas: '108-88-3', peaks })), actor: curator });
    expect(a.report.status).toBe('imported');
    const b = await importFile({ fileName: 'cas-b.jdx', bytes: Buffer.from(peakTableFile({ title: `Methylbenzene ${RUN}`, formula: 'C7H8', cas: '108-88-3', peaks })), actor: curator });
    expect(b.report.status).toBe('duplicate');
    expect(b.report.duplicateOf).toBe(a.report.spectra[0].id);
  });

  it('the same peaks under another compound need confirmation, and are stored only after it', async () => {
    const peaks = randomPeaks(next);
    const first = await runImport({ actor: curator, files: [{ name: 'orig.jdx', bytes: Buffer.from(peakTableFile({ title: `Original ${RUN}`, formula: 'C6H12O', peaks })) }] });
    expect(first.files[0].status).toBe('imported');
    const before = await libraryCounts(sequelize);
    const other = await runImport({ actor: curator, files: [{ name: 'mislabel.jdx', bytes: Buffer.from(peakTableFile({ title: `Mislabel ${RUN}`, formula: 'C5H10O2', peaks })) }] });
    const r = other.files[0];
    expect(r.status).toBe('needs_confirmation');
    expect(r.warnings.map((w) => w.code)).toContain('same_peaks_other_compound');
    expect(r.samePeaksAs?.map((s) => s.id)).toContain(first.files[0].spectra[0].id);
    expect(r.spectra).toEqual([]);
    expect(await libraryCounts(sequelize)).toEqual(before);
    const batch = await getBatch(other.batchId);
    expect(batch.files[0].status).toBe('needs_confirmation');

    const confirmed = await confirmFile(other.batchId, 'mislabel.jdx', curator);
    expect(confirmed.status).toBe('imported');
    expect(confirmed.spectra).toHaveLength(1);
    const after = await libraryCounts(sequelize);
    expect(after.records).toBe(before.records + 1);
    await expect(confirmFile(other.batchId, 'mislabel.jdx', curator)).rejects.toMatchObject({ status: 409 });
    expect((await getBatch(other.batchId)).files[0].status).toBe('imported');
  });

  it('a replicate of the same compound with cosine above 0.98 is stored with a near-duplicate warning', async () => {
    const peaks = randomPeaks(next, 15);
    const a = await importFile({ fileName: 'rep-1.jdx', bytes: Buffer.from(peakTableFile({ title: `Replicate ${RUN}`, formula: 'C9H12', peaks })), actor: curator });
    expect(a.report.status).toBe('imported');
    const nudged = peaks.map(([mz, i], k) => [mz, k === 0 ? i * 0.9 + 1 : i] as [number, number]);
    const b = await importFile({ fileName: 'rep-2.jdx', bytes: Buffer.from(peakTableFile({ title: `Replicate ${RUN}`, formula: 'C9H12', peaks: nudged })), actor: curator });
    expect(b.report.status).toBe('imported');
    expect(b.report.warnings.find((w) => w.code === 'near_duplicate')?.message).toMatch(new RegExp(`record ${a.report.spectra[0].id}`));
    const c = await importFile({ fileName: 'rep-3.jdx', bytes: Buffer.from(peakTableFile({ title: `Replicate ${RUN}`, formula: 'C9H12', peaks: randomPeaks(next, 15) })), actor: curator });
    expect(c.report.status).toBe('imported');
    expect(c.report.warnings.map((w) => w.code)).not.toContain('near_duplicate');
  });
});

function ntuplesFile(pages: number, seed: number): string {
  const next = rng(seed);
  const lines = [`##TITLE= Run ${RUN} ${seed}`, '##JCAMP-DX= 5.01', '##DATA TYPE= MASS SPECTRUM', '##DATA CLASS= NTUPLES', '##ORIGIN= tests', '##OWNER= tests',
    `##NAMES= Run mixture ${RUN} ${seed}`, '##.IONIZATION ENERGY= 70',
    '##NTUPLES= MASS SPECTRUM', '##VAR_NAME= MASS, INTENSITY, RETENTION TIME', '##SYMBOL= X, Y, T', '##VAR_TYPE= INDEPENDENT, DEPENDENT, INDEPENDENT',
    '##VAR_FORM= AFFN, AFFN, AFFN', `##VAR_DIM= , , ${pages}`, '##UNITS= M/Z, RELATIVE ABUNDANCE, SECONDS', '##FACTOR= 1, 1, 1'];
  for (let p = 1; p <= pages; p++) {
    const peaks = randomPeaks(next, 8);
    lines.push(`##PAGE= T= ${p * 10}`, `##NPOINTS= ${peaks.length}`, '##DATA TABLE= (XY..XY), PEAKS', ...peaks.map(([m, i]) => `${m}, ${i}`));
  }
  lines.push('##END NTUPLES= MASS SPECTRUM', '##END=', '');
  return lines.join('\n');
}

describe('NTUPLES runs and page selection', () => {
  it('a run of 20 pages imports every page', async () => {
    const r = await importFile({ fileName: 'run20.jdx', bytes: Buffer.from(ntuplesFile(20, 1)), actor: curator });
    expect(r.report.status).toBe('imported');
    expect(r.report.spectra).toHaveLength(20);
    expect(r.report.spectra.map((s) => s.page)).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
  });

  it('a run of more than 20 pages needs a selection and stores nothing until it has one', async () => {
    const text = ntuplesFile(25, 2);
    const before = await libraryCounts(sequelize);
    const r = await runImport({ actor: curator, files: [{ name: 'run25.jdx', bytes: Buffer.from(text) }] });
    expect(r.files[0].status).toBe('needs_selection');
    expect(r.files[0].pageCount).toBe(25);
    expect(r.files[0].found).toHaveLength(25);
    expect(await libraryCounts(sequelize)).toEqual(before);
    await expect(confirmFile(r.batchId, 'run25.jdx', curator)).rejects.toMatchObject({ status: 400, code: 'pages_required' });
    const chosen = await confirmFile(r.batchId, 'run25.jdx', curator, [2, 5]);
    expect(chosen.status).toBe('imported');
    expect(chosen.spectra.map((s) => s.page)).toEqual([2, 5]);
    expect(chosen.found.filter((f) => f.outcome === 'skipped')).toHaveLength(23);
    expect((await libraryCounts(sequelize)).records).toBe(before.records + 2);
  });

  it('the pages field selects pages at upload, or says all', async () => {
    const some = await runImport({ actor: curator, files: [{ name: 'run30.jdx', bytes: Buffer.from(ntuplesFile(30, 3)) }], pages: { 'run30.jdx': [1, 30] } });
    expect(some.files[0].status).toBe('imported');
    expect(some.files[0].spectra.map((s) => s.page)).toEqual([1, 30]);
    const all = await runImport({ actor: curator, files: [{ name: 'run22.jdx', bytes: Buffer.from(ntuplesFile(22, 4)) }], pages: { 'run22.jdx': 'all' } });
    expect(all.files[0].spectra).toHaveLength(22);
    const bad = await runImport({ actor: curator, files: [{ name: 'run23.jdx', bytes: Buffer.from(ntuplesFile(23, 5)) }], pages: { 'run23.jdx': [24] } });
    expect(bad.files[0].status).toBe('rejected');
    expect(bad.files[0].error).toMatch(/page 24 does not exist/);
  });
});

describe('warnings of the report', () => {
  const codes = async (opts: Parameters<typeof peakTableFile>[0], name = 'warn.jdx') =>
    (await importFile({ fileName: name, bytes: Buffer.from(peakTableFile(opts)), actor: curator })).report.warnings.map((w) => w.code);
  const next = rng(99);

  it('formula that does not parse', async () => {
    expect(await codes({ title: `W1 ${RUN}`, formula: 'C6H6Xx', peaks: randomPeaks(next) })).toContain('formula_unparsable');
  });
  it('stated MW far from both the nominal and the average mass', async () => {
    // benzene: nominal 78, average 78.11 (IUPAC conventional weights)
    expect(await codes({ title: `W2 ${RUN}`, formula: 'C6H6', mw: 80, peaks: [[51, 200], [77, 300], [78, 999]] })).toContain('mw_mismatch');
    expect(await codes({ title: `W2b ${RUN}`, formula: 'C6H6', mw: 78.11, peaks: [[50, 200], [77, 300], [78, 999]] })).not.toContain('mw_mismatch');
  });
  it('registry number failing its check digit', async () => {
    // 71-43-2 is benzene's (check digit rule: CAS); 71-43-3 fails it
    expect(await codes({ title: `W3 ${RUN}`, formula: 'C6H6', cas: '71-43-3', peaks: randomPeaks(next) })).toContain('registry_check_digit');
  });
  it('non-integer or negative IHD', async () => {
    expect(await codes({ title: `W4 ${RUN}`, formula: 'C2H7', peaks: randomPeaks(next) })).toContain('ihd_invalid');
    expect(await codes({ title: `W4b ${RUN}`, formula: 'CH6', peaks: randomPeaks(next) })).toContain('ihd_invalid');
  });
  it('highest significant cluster not at the nominal mass', async () => {
    expect(await codes({ title: `W5 ${RUN}`, formula: 'C6H6', peaks: [[39, 100], [51, 200], [63, 999]] })).toContain('molecular_ion_mismatch');
    expect(await codes({ title: `W5b ${RUN}`, formula: 'C6H6', peaks: [[39, 100], [52, 200], [78, 999], [79, 66]] })).not.toContain('molecular_ion_mismatch');
  });
  it('structure and formula disagreeing', async () => {
    expect(await codes({ title: `W6 ${RUN}`, formula: 'C6H6', peaks: randomPeaks(next), extra: ['##$SMILES= CCO'] })).toContain('structure_formula_mismatch');
    expect(await codes({ title: `W6b ${RUN}`, formula: 'C2H6O', peaks: [[31, 999], [45, 400], [46, 200]], extra: ['##$SMILES= CCO'] })).not.toContain('structure_formula_mismatch');
  });
  it('no ionization energy', async () => {
    expect(await codes({ title: `W7 ${RUN}`, formula: 'C6H6', energy: null, peaks: randomPeaks(next) })).toContain('no_ionization_energy');
  });
});

const good = (title: string) => peakTableFile({ title, formula: 'C6H6', peaks: [[51, 100], [77, 300], [78, 999]] });

export const BAD_FILES: [string, string | Buffer, RegExp][] = [
  ['truncated.jdx', good(`T ${RUN}`).slice(0, good(`T ${RUN}`).indexOf('77, 300') + 4), /END|truncated|incomplete/i],
  ['binary.jdx', Buffer.from(Array.from({ length: 400 }, (_, i) => (i * 37 + 11) % 256)), /binary|not a JCAMP|control|undecodable/i],
  ['not-jcamp.txt', 'name,mz,intensity\nbenzene,78,999\n', /not a JCAMP-DX/i],
  ['empty.jdx', '', /empty/i],
  ['no-end.jdx', good(`NE ${RUN}`).replace('##END=\n', ''), /END=/],
  ['npoints.jdx', good(`NP ${RUN}`).replace('##NPOINTS= 3', '##NPOINTS= 4'), /NPOINTS/],
  ['nan.jdx', good(`NaN ${RUN}`).replace('77, 300', '77, NaN'), /not a number/],
  ['infinity.jdx', good(`Inf ${RUN}`).replace('77, 300', '77, Infinity'), /not a number/],
  ['overflow.jdx', good(`Ovf ${RUN}`).replace('77, 300', '77, 1e999'), /finite|number|not/i],
  ['negative-mz.jdx', good(`Neg ${RUN}`).replace('51, 100', '-51, 100'), /positive|m\/z/i],
  ['huge-mz.jdx', good(`Huge ${RUN}`).replace('78, 999', '1.5e308, 999'), /beyond/],
  ['zero-mz.jdx', good(`Zero ${RUN}`).replace('51, 100', '0, 100'), /positive|m\/z/i],
  ['duplicate-label.jdx', good(`DL ${RUN}`).replace('##OWNER= test', '##OWNER= test\n##OWNER= other'), /duplicate label/i],
  ['too-many-peaks.jdx', peakTableFile({ title: `Many ${RUN}`, formula: 'C6H6', peaks: Array.from({ length: 100_001 }, (_, i) => [1 + i * 0.01, 5] as [number, number]) }), /limit|100000|100,000/i],
  ['bad/name.jdx', good(`Path ${RUN}`), /path separator/i],
  ['bad\u0007name.jdx', good(`Ctl ${RUN}`), /control character/i],
  ['dif-check.jdx', fixture(SPECTRA_FIXTURES, 'xydata-dif.jdx').toString('utf8').replace('44@Nn%QK2J30K5J0', '44%Nn%QK2J30K5J0'), /check|DIF|Y/i],
  ['x-stray.jdx', fixture(SPECTRA_FIXTURES, 'xydata-affn.jdx').toString('utf8').replace('\n45 5 0 0', '\n46 5 0 0'), /X|line/i],
  ['blocks.jdx', fixture(SPECTRA_FIXTURES, 'link-compound.jdx').toString('utf8').replace('##BLOCKS= 2', '##BLOCKS= 3'), /BLOCKS/],
  ['ntuples-open.jdx', fixture(SPECTRA_FIXTURES, 'ntuples-run.jdx').toString('utf8').replace('##END NTUPLES= MASS SPECTRUM\n', ''), /NTUPLES/],
];

describe('bad input gets a clear per-file error and writes nothing', () => {
  it('rejects each bad file with a message, and the library does not change', async () => {
    const before = await libraryCounts(sequelize);
    const [audit0] = await sequelize.query<any>('SELECT COUNT(*) AS n FROM audit_event', { type: QueryTypes.SELECT });
    const r = await runImport({ actor: curator, files: BAD_FILES.map(([name, content]) => ({ name, bytes: Buffer.isBuffer(content) ? content : Buffer.from(content, 'utf8') })) });
    r.files.forEach((report, i) => {
      const [name, , pattern] = BAD_FILES[i];
      expect(report.status, `${name}: ${JSON.stringify(report)}`).toBe('rejected');
      expect(report.error, name).toMatch(pattern);
      expect(report.spectra).toEqual([]);
    });
    expect(await libraryCounts(sequelize)).toEqual(before);
    const [audit1] = await sequelize.query<any>('SELECT COUNT(*) AS n FROM audit_event', { type: QueryTypes.SELECT });
    expect(Number(audit1.n)).toBe(Number(audit0.n));
    const batch = await getBatch(r.batchId);
    expect(batch.done).toBe(true);
    expect(batch.counts).toEqual({ rejected: BAD_FILES.length });
  }, 120_000);

  it('a valid file beside bad ones in one batch is still imported (one transaction a file)', async () => {
    const before = await libraryCounts(sequelize);
    const r = await runImport({ actor: curator, files: [
      { name: 'bad.jdx', bytes: Buffer.from('##TITLE= x\n##JCAMP-DX= 5.01\n##PEAK TABLE= (XY..XY)\n1, 2\n') },
      { name: 'ok.jdx', bytes: Buffer.from(peakTableFile({ title: `Beside ${RUN}`, formula: 'C4H10', peaks: [[43, 999], [58, 120]] })) },
    ] });
    expect(r.files.map((f) => f.status)).toEqual(['rejected', 'imported']);
    expect((await libraryCounts(sequelize)).records).toBe(before.records + 1);
  });
});

describe('fixtures of our own', () => {
  it('a file in tests/fixtures/import imports as its README says', async () => {
    const r = await storeWhatever('chlorotoluene-xyw.jdx', tokenized(fixture(IMPORT_FIXTURES, 'chlorotoluene-xyw.jdx')));
    expectPeaksEqual(await storedPeaks(sequelize, r.ids[0]), [[63, 120], [89, 180], [91, 999], [126, 640], [127, 49], [128, 208], [129, 16]]);
    expect(codesOf(r.report)).toEqual([]);
  });
});
