// src/lib/records against the test database: the library list (current
// versions, filters, fuzzy names, sorting, paging), the CSV export and one
// record with its versions and history. The database is shared across test
// files, so every row here carries this run's marker and every query is scoped
// to the records made here.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import { getModels } from '../../../src/lib/db';
import { encodePeaks } from '../../../src/lib/spectra/encodePeaks';
import { appendAudit } from '../../../src/lib/audit';
import { exportRecordsCsv, getRecord, listRecords, spectraListQuerySchema } from '../../../src/lib/records';

const sequelize = useTestDatabase();
afterAll(() => closeSequelize());

const RUN = crypto.randomBytes(3).toString('hex');
const ids: Record<string, number> = {};
const q = (extra: Record<string, string> = {}) => spectraListQuerySchema.parse({ ids: Object.values(ids).join(','), ...extra });

interface VersionSpec {
  status: string;
  name?: string;
  peaks?: [number, number][];
}

async function makeRecord(key: string, spec: { name: string; synonyms?: string[]; formula: string; nominalMass: number; ihd: number; elements: string; synthetic?: boolean; versions: VersionSpec[]; tags?: string[] }) {
  const m = getModels(sequelize);
  const now = new Date();
  const compound = await m.Compound.create({ name: spec.name, nameKey: spec.name.toLowerCase(), formula: spec.formula, createdAt: now, updatedAt: now });
  const released = spec.versions.map((v, i) => (v.status === 'released' ? i + 1 : null)).filter(Boolean).pop() ?? null;
  const record = await m.SpectrumRecord.create({
    compoundId: compound.get('id'), latestVersion: spec.versions.length, releasedVersion: released, synthetic: !!spec.synthetic, createdAt: now, updatedAt: now,
  });
  const recordId = Number(record.get('id'));
  for (const [i, v] of spec.versions.entries()) {
    const peaks = v.peaks ?? [[41, 20], [spec.nominalMass - 15, 100], [spec.nominalMass, 40 + i]];
    await m.SpectrumVersion.create({
      recordId, version: i + 1, status: v.status, name: v.name ?? spec.name, synonyms: spec.synonyms ?? [], formula: spec.formula, nominalMass: spec.nominalMass,
      ihd: spec.ihd, elements: spec.elements, peaks: encodePeaks(peaks), peakCount: peaks.length, basePeakMz: spec.nominalMass - 15,
      contentHash: crypto.createHash('sha256').update(`${RUN}-${key}-${i}`).digest('hex'), synthetic: !!spec.synthetic, metadata: {}, editors: [],
      createdAt: now, updatedAt: now,
    });
    await appendAudit({ action: 'record.version_created', targetType: 'record', targetId: String(recordId), recordId, version: i + 1, reason: `made v${i + 1}` });
  }
  for (const t of spec.tags ?? []) {
    const [tag] = await m.Tag.findOrCreate({ where: { name: `${t}-${RUN}` }, defaults: { name: `${t}-${RUN}`, createdAt: now, updatedAt: now } });
    await m.RecordTag.create({ recordId, tagId: tag.get('id') });
  }
  ids[key] = recordId;
}

beforeAll(async () => {
  await makeRecord('toluene', { name: `Toluene ${RUN}`, synonyms: [`methylbenzene ${RUN}`], formula: 'C7H8', nominalMass: 92, ihd: 4, elements: 'C,H', synthetic: true, versions: [{ status: 'released' }], tags: ['solvent', 'aromatic'] });
  await makeRecord('chloro', { name: `Chlorobenzene ${RUN}`, formula: 'C6H5Cl', nominalMass: 112, ihd: 4, elements: 'C,Cl,H', versions: [{ status: 'superseded' }, { status: 'released' }, { status: 'draft', name: `Chlorobenzene ${RUN} (edited)` }], tags: ['aromatic'] });
  await makeRecord('hexane', { name: `Hexane ${RUN}`, formula: 'C6H14', nominalMass: 86, ihd: 0, elements: 'C,H', versions: [{ status: 'released' }], tags: ['solvent'] });
  await makeRecord('draftonly', { name: `Pyridine ${RUN}`, formula: 'C5H5N', nominalMass: 79, ihd: 4, elements: 'C,H,N', versions: [{ status: 'in_review' }] });
  await makeRecord('retired', { name: `Benzene ${RUN}`, formula: 'C6H6', nominalMass: 78, ihd: 4, elements: 'C,H', versions: [{ status: 'retired' }] });
});

describe('listRecords', () => {
  it('lists the released version of each record by default, nothing else', async () => {
    const r = await listRecords(q());
    expect(r.total).toBe(3);
    expect(r.items.map((i) => i.id).sort()).toEqual([ids.toluene, ids.chloro, ids.hexane].sort());
    const chloro = r.items.find((i) => i.id === ids.chloro)!;
    expect(chloro).toMatchObject({ version: 2, status: 'released', formula: 'C6H5Cl', nominalMass: 112, peakCount: 3, basePeak: 97, synthetic: false });
    const toluene = r.items.find((i) => i.id === ids.toluene)!;
    expect(toluene.synthetic).toBe(true);
    expect(toluene.tags).toEqual([`aromatic-${RUN}`, `solvent-${RUN}`]);
  });

  it('lists the newest version among the asked statuses for curators', async () => {
    const r = await listRecords(q(), { statuses: ['draft', 'in_review'] });
    expect(r.items.map((i) => [i.id, i.version, i.status]).sort()).toEqual(
      [[ids.chloro, 3, 'draft'], [ids.draftonly, 1, 'in_review']].sort(),
    );
  });

  it('filters by formula (Hill order), elements, IHD, mass and tags', async () => {
    expect((await listRecords(q({ formula: 'CH3C6H5' }))).items.map((i) => i.id)).toEqual([ids.toluene]);
    expect((await listRecords(q({ elements: 'Cl' }))).items.map((i) => i.id)).toEqual([ids.chloro]);
    expect((await listRecords(q({ excludeElements: 'Cl' }))).total).toBe(2);
    expect((await listRecords(q({ ihdMax: '0' }))).items.map((i) => i.id)).toEqual([ids.hexane]);
    expect((await listRecords(q({ massMin: '90', massMax: '100' }))).items.map((i) => i.id)).toEqual([ids.toluene]);
    expect((await listRecords(q({ tags: `SOLVENT-${RUN}` }))).total).toBe(2);
    expect((await listRecords(q({ tags: `solvent-${RUN},aromatic-${RUN}` }))).items.map((i) => i.id)).toEqual([ids.toluene]);
  });

  it('finds a record from a misspelt name, and by synonym', async () => {
    const r = await listRecords(q({ q: `tolune ${RUN}` }));
    expect(r.items[0].id).toBe(ids.toluene);
    const s = await listRecords(q({ q: `methylbenzene ${RUN}` }));
    expect(s.items[0]).toMatchObject({ id: ids.toluene, matchedSynonym: `methylbenzene ${RUN}` });
    expect(s.sort).toBe('relevance');
  });

  it('sorts by an allowed key both ways and pages', async () => {
    const asc = await listRecords(q({ sort: 'nominalMass' }));
    expect(asc.items.map((i) => i.nominalMass)).toEqual([86, 92, 112]);
    const desc = await listRecords(q({ sort: '-nominalMass', pageSize: '2', page: '1' }));
    expect(desc.items.map((i) => i.nominalMass)).toEqual([112, 92]);
    expect(desc.total).toBe(3);
    const page2 = await listRecords(q({ sort: '-nominalMass', pageSize: '2', page: '2' }));
    expect(page2.items.map((i) => i.nominalMass)).toEqual([86]);
    const named = await listRecords(q({ sort: '-name' }));
    expect(named.items.map((i) => i.id)).toEqual([ids.toluene, ids.hexane, ids.chloro]);
  });

  it('sorts name-search results by another key when asked', async () => {
    const r = await listRecords(q({ q: RUN, sort: '-nominalMass' }));
    expect(r.items.map((i) => i.nominalMass)).toEqual([112, 92, 86]);
  });
});

describe('exportRecordsCsv', () => {
  it('writes one line a peak with the record metadata, every page of the view', async () => {
    const { csv, records } = await exportRecordsCsv(q({ pageSize: '1', sort: 'nominalMass' }));
    expect(records).toBe(3);
    const lines = csv.trim().split('\r\n');
    expect(lines[0]).toBe('record_id,version,name,formula,nominal_mass,ihd,cas_registry_no,tags,status,synthetic_demo,peak_count,base_peak_mz,mz,intensity');
    expect(lines).toHaveLength(1 + 9);
    expect(lines[1]).toBe(`${ids.hexane},1,Hexane ${RUN},C6H14,86,0,,solvent-${RUN},released,no,3,71,41,20`);
    expect(lines.filter((l) => l.startsWith(`${ids.toluene},`)).every((l) => l.includes(',yes,'))).toBe(true);
  });
});

describe('getRecord', () => {
  it('shows everyone the released version, with versions and history of what they may see', async () => {
    const r = await getRecord(ids.chloro);
    expect(r).toMatchObject({ id: ids.chloro, version: 2, status: 'released', latestVersion: 3, releasedVersion: 2 });
    expect(r.compound).toMatchObject({ name: `Chlorobenzene ${RUN}`, formula: 'C6H5Cl', elements: ['C', 'Cl', 'H'] });
    expect(r.peaks).toEqual([[41, 20], [97, 100], [112, 41]]);
    expect(r.versions.map((v) => [v.version, v.status])).toEqual([[1, 'superseded'], [2, 'released']]);
    expect(r.history.map((e) => e.version)).toEqual([1, 2]);
    expect(r.tags).toEqual([`aromatic-${RUN}`]);
  });

  it('reads an old version on request', async () => {
    const r = await getRecord(ids.chloro, { version: 1 });
    expect(r).toMatchObject({ version: 1, status: 'superseded' });
  });

  it('hides drafts and versions in review from callers who may not curate or audit', async () => {
    await expect(getRecord(ids.chloro, { version: 3 })).rejects.toMatchObject({ status: 404 });
    await expect(getRecord(ids.draftonly)).rejects.toMatchObject({ status: 404 });
    await expect(getRecord(999_999_999)).rejects.toMatchObject({ status: 404 });
  });

  it('shows curators and auditors the newest version, drafts included', async () => {
    const r = await getRecord(ids.chloro, { privileged: true });
    expect(r).toMatchObject({ version: 3, status: 'draft' });
    expect(r.compound.name).toBe(`Chlorobenzene ${RUN} (edited)`);
    expect(r.versions).toHaveLength(3);
    expect(r.history.map((e) => e.reason)).toEqual(['made v1', 'made v2', 'made v3']);
    expect((await getRecord(ids.draftonly, { privileged: true })).status).toBe('in_review');
  });

  it('keeps retired records readable and marked', async () => {
    const r = await getRecord(ids.retired);
    expect(r.status).toBe('retired');
  });
});
