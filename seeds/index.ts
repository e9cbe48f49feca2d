// The demo scenario: an invented laboratory with invented people, real
// compounds, and SYNTHETIC spectra (seeds/synthetic-spectrum.ts), each flagged
// synthetic in the data. Seeds only an empty database (no records, no users),
// in one transaction; otherwise it touches nothing.
import crypto from 'node:crypto';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { hashPassword } from 'better-auth/crypto';
import { appendAudit } from '../src/lib/audit';
import { encodePeaks, peakContentHash } from '../src/lib/spectra/index';
import { versionDigest, APPROVAL_MEANING } from '../src/lib/curation/workflow';
import { compoundNameKey } from '../src/lib/curation/compoundKey';
import { DEMO_COMPOUNDS, type DemoCompound } from './compounds';
import { compoundChemistry } from './compound-chemistry';
import { SYNTHETIC_NOTE, seededRandom, syntheticSpectrum } from './synthetic-spectrum';
import { seedDemoReports } from './reports';

export const DEMO_LAB = 'Tarnholm Analytical, Process Chemistry Lab';

export interface DemoUser { key: string; email: string; name: string; roles: string[]; title: string }

/** Invented people; the e-mail addresses are fixed by API.md. */
export const DEMO_USERS: DemoUser[] = [
  { key: 'admin', email: 'admin@demo.ionotheca.test', name: 'Maren Oystead', roles: ['admin'], title: 'Lab systems administrator' },
  { key: 'curator', email: 'curator@demo.ionotheca.test', name: 'Ilse Varnholt', roles: ['curator'], title: 'Head of the spectral library' },
  { key: 'curator2', email: 'curator2@demo.ionotheca.test', name: 'Tobiah Quennell', roles: ['curator'], title: 'Senior analyst, second reviewer' },
  { key: 'analyst', email: 'analyst@demo.ionotheca.test', name: 'Noor Ellingsby', roles: ['analyst'], title: 'GC-MS analyst' },
  { key: 'viewer', email: 'viewer@demo.ionotheca.test', name: 'Caspar Whitlowe', roles: ['viewer'], title: 'Project chemist' },
  { key: 'auditor', email: 'auditor@demo.ionotheca.test', name: 'Renata Achterhof', roles: ['auditor'], title: 'Quality assurance' },
];

const INSTRUMENTS = [
  'Tarnholm GC-MS bench 1 (single quadrupole)',
  'Tarnholm GC-MS bench 2 (single quadrupole)',
];
const METHOD = 'PCL-GEN-07 general screening, 30 m non-polar column, 40–300 °C';
const COLUMN = '30 m × 0.25 mm × 0.25 µm, 5 % phenyl methylpolysiloxane';
const DEMO_TAG = 'synthetic demo';

/** Tag colours of our own. */
const TAG_COLOURS: Record<string, string> = {
  [DEMO_TAG]: '#b4532a',
  'RI ladder': '#3d5a80',
  solvent: '#5c7c4a',
  halogenated: '#7a4e8c',
  aromatic: '#c08a1e',
  'column bleed': '#6b6b6b',
  alkane: '#4f6d7a', alkene: '#56828f', cycloalkane: '#3f7f74',
  alcohol: '#2f6f73', phenol: '#8a5a44', ketone: '#a0522d', aldehyde: '#b5651d', acid: '#9c3d54',
  ester: '#7d5ba6', ether: '#5b6aa6', amine: '#2e7d32', amide: '#4a7b3f', nitrile: '#00796b', nitro: '#bf360c',
  'N-heterocycle': '#1b6f8a', 'O-heterocycle': '#6d8f2e', sulfur: '#a68b00', fluorinated: '#00838f',
  organosilicon: '#546e7a', 'TMS derivative': '#455a64',
};

export interface SeedCounts {
  users: number;
  compounds: number;
  records: number;
  versions: number;
  released: number;
  inReview: number;
  draft: number;
  tags: number;
  retentionIndices: number;
  signatures: number;
  auditEvents: number;
  settings: number;
}

export interface SeedResult { seeded: boolean; reason?: string; counts: SeedCounts }

export interface SeedOptions {
  /** Password of every demo user (DEMO_PASSWORD). */
  password: string;
  log?: (line: string) => void;
}

type Status = 'released' | 'in_review' | 'draft';
/** What happens to a record in the scenario. */
interface Plan {
  status: Status;
  /** A released record with a second version: released (v1 superseded), in review or draft. */
  second?: Status;
  importer: DemoUser;
  reviewer: DemoUser;
}

const emptyCounts = (): SeedCounts => ({
  users: 0, compounds: 0, records: 0, versions: 0, released: 0, inReview: 0, draft: 0, tags: 0, retentionIndices: 0,
  signatures: 0, auditEvents: 0, settings: 0,
});

/** Which records end up released, in review or draft, and who curated them: deterministic. */
export function planScenario(compounds: DemoCompound[] = DEMO_COMPOUNDS): Plan[] {
  const rnd = seededRandom('ionotheca demo scenario v1');
  const curator = DEMO_USERS[1];
  const curator2 = DEMO_USERS[2];
  const plans: Plan[] = compounds.map((c, i) => {
    const byFirst = i % 3 !== 2;
    const importer = byFirst ? curator : curator2;
    const reviewer = byFirst ? curator2 : curator;
    const u = rnd();
    // The retention-index ladder is always released: searches with an RI window need it.
    const status: Status = c.tags?.includes('RI ladder') ? 'released' : u < 0.07 ? 'draft' : u < 0.14 ? 'in_review' : 'released';
    return { status, importer, reviewer };
  });
  // A few released records carry history: a second version, in each state.
  const released = plans.map((p, i) => [p, i] as const).filter(([p, i]) => p.status === 'released' && !compounds[i].tags?.includes('RI ladder'));
  const pick = (k: number) => released[Math.floor(k * released.length / 9) + 1]?.[0];
  (['released', 'released', 'released', 'released', 'in_review', 'in_review', 'draft', 'draft'] as Status[]).forEach((s, k) => {
    const p = pick(k);
    if (p) p.second = s;
  });
  return plans;
}

async function count(sequelize: Sequelize, table: string, t?: Transaction): Promise<number> {
  const [row] = await sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM \`${table}\``, { type: QueryTypes.SELECT, transaction: t });
  return Number(row?.n ?? 0);
}

async function insert(sequelize: Sequelize, table: string, row: Record<string, unknown>, t: Transaction): Promise<number> {
  const cols = Object.keys(row);
  const values = cols.map((c) => {
    const v = row[c];
    return v !== null && typeof v === 'object' && !(v instanceof Date) && !Buffer.isBuffer(v) ? JSON.stringify(v) : v;
  });
  const [id] = await sequelize.query(
    `INSERT INTO \`${table}\` (${cols.map((c) => `\`${c}\``).join(', ')}) VALUES (${cols.map(() => '?').join(', ')})`,
    { replacements: values, type: QueryTypes.INSERT, transaction: t },
  );
  return Number(id);
}

/** Seed the demo scenario into an empty database; refuse, touching nothing, otherwise. */
export async function seedDemo(sequelize: Sequelize, { password, log = () => {} }: SeedOptions): Promise<SeedResult> {
  if (!password) throw new RangeError('password is required (DEMO_PASSWORD)');
  const counts = emptyCounts();
  const refusal = async (t?: Transaction): Promise<SeedResult | null> => {
    const records = await count(sequelize, 'spectrum_record', t);
    const users = await count(sequelize, 'user', t);
    if (records === 0 && users === 0) return null;
    return { seeded: false, reason: `the database is not empty (${records} records, ${users} users): the demo is seeded only into an empty database`, counts };
  };
  // The usual case on a restart: a quick look, no password hashing.
  const early = await refusal();
  if (early) return early;
  // Hash before the transaction: better-auth's scrypt takes a while per user.
  const hashes = await Promise.all(DEMO_USERS.map(() => hashPassword(password)));
  const plans = planScenario();

  return sequelize.transaction(async (t) => {
    // Serialise concurrent seeders (two servers starting together): the row lock
    // comes first, so the counts below see whatever the other one committed.
    await sequelize.query('SELECT version FROM library_state WHERE id = 1 FOR UPDATE', { type: QueryTypes.SELECT, transaction: t });
    const refused = await refusal(t);
    if (refused) return refused;
    const now = new Date();
    const q = (table: string, row: Record<string, unknown>) => insert(sequelize, table, row, t);
    const audit = (user: DemoUser | null, input: Omit<Parameters<typeof appendAudit>[0], 'actorId' | 'actorEmail'>) => {
      counts.auditEvents++;
      return appendAudit({ actorId: user ? ids.get(user.key)! : null, actorEmail: user?.email ?? null, ...input }, t);
    };

    // People
    const ids = new Map<string, string>();
    for (const [i, u] of DEMO_USERS.entries()) {
      const id = crypto.randomUUID();
      ids.set(u.key, id);
      await q('user', { id, name: u.name, email: u.email, emailVerified: true, image: null, roles: u.roles.join(','), active: true, createdAt: now, updatedAt: now });
      await q('account', { id: crypto.randomUUID(), accountId: id, providerId: 'credential', userId: id, password: hashes[i], createdAt: now, updatedAt: now });
      counts.users++;
    }
    log(`users: ${counts.users}`);
    const admin = DEMO_USERS[0];
    await audit(admin, { action: 'demo.seed.start', targetType: 'library', details: { lab: DEMO_LAB, users: DEMO_USERS.map((u) => ({ email: u.email, roles: u.roles })), note: 'invented laboratory and people; synthetic spectra' } });

    // Tags
    const tagIds = new Map<string, number>();
    const tagId = async (name: string) => {
      let id = tagIds.get(name);
      if (id === undefined) {
        id = await q('tag', { name, colour: TAG_COLOURS[name] ?? '#2f6f73', createdAt: now, updatedAt: now });
        tagIds.set(name, id);
        counts.tags++;
      }
      return id;
    };
    await tagId(DEMO_TAG);

    // Compounds, records, versions
    for (const [index, c] of DEMO_COMPOUNDS.entries()) {
      const plan = plans[index];
      const chem = compoundChemistry(c.formula);
      const spectrum = syntheticSpectrum({ formula: c.formula, smiles: c.smiles, cls: c.cls, molecularIon: c.molecularIon !== 'absent' });
      const peaks = spectrum.peaks;
      const compoundId = await q('compound', {
        name: c.name, nameKey: compoundNameKey(c.name), formula: chem.formula,
        casRegistryNo: c.cas ?? null, createdAt: now, updatedAt: now,
      });
      counts.compounds++;
      const recordId = await q('spectrum_record', {
        compoundId, latestVersion: 1, releasedVersion: null, synthetic: true, createdBy: ids.get(plan.importer.key)!, createdAt: now, updatedAt: now,
      });
      counts.records++;
      const importerId = ids.get(plan.importer.key)!;
      const reviewerId = ids.get(plan.reviewer.key)!;
      const instrument = INSTRUMENTS[index % INSTRUMENTS.length];
      const acquired = new Date(Date.UTC(2025, 0, 6) + index * 19 * 3600 * 1000).toISOString().slice(0, 10);
      const base = {
        recordId, name: c.name, synonyms: c.synonyms ?? [], formula: chem.formula, nominalMass: chem.nominalMass,
        monoisotopicMass: chem.monoisotopicMass, averageMass: chem.averageMass, ihd: chem.ihd, elements: chem.elements,
        smiles: c.smiles, molfile: null, casRegistryNo: c.cas ?? null, derivative: c.derivative ?? null, parentCompound: c.parentCompound ?? null,
        saltForm: null, technique: 'EI-MS', ionizationMode: 'EI+', ionizationEnergy: 70, instrument, analyzerType: 'quadrupole',
        sourceTemperature: 230, massRangeMin: spectrum.lowMassCutoff, massRangeMax: spectrum.highMassCutoff, method: METHOD,
        retentionTime: null, referenceLot: null, referencePurity: null, acquiredAt: acquired, acquiredBy: plan.importer.name,
        origin: `${DEMO_LAB} (synthetic demo data)`, owner: DEMO_LAB, notes: SYNTHETIC_NOTE,
        metadata: {
          synthetic: true, note: SYNTHETIC_NOTE, compoundClass: c.cls,
          molecularIonShown: spectrum.molecularIonShown,
          ...(c.ri !== undefined ? { retentionIndexNote: 'synthetic demo value' } : {}),
        },
        peaks: encodePeaks(peaks), peakCount: peaks.length, basePeakMz: spectrum.basePeakMz, contentHash: peakContentHash(peaks),
        sourceText: null, sourceFileName: null, importBatchId: null, synthetic: true,
      };
      const addVersion = async (version: number, extra: Record<string, unknown>) => {
        const id = await q('spectrum_version', {
          ...base, version, createdBy: importerId, editors: [importerId], submittedBy: null, submittedAt: null, approvedBy: null,
          approvedAt: null, retiredAt: null, changeReason: null, createdAt: now, updatedAt: now, ...extra,
        });
        counts.versions++;
        if (c.ri !== undefined) {
          await q('retention_index', {
            spectrumVersionId: id, phase: 'non-polar', value: c.ri,
            ladder: c.ri >= 800 && c.ri <= 2000 ? 'C8–C20 n-alkanes' : 'C5–C24 n-alkanes', column: COLUMN,
          });
          counts.retentionIndices++;
        }
        return id;
      };
      const release = async (version: number, versionId: number) => {
        const at = new Date();
        await sequelize.query("UPDATE spectrum_version SET status = 'released', approvedBy = ?, approvedAt = ? WHERE id = ?", {
          replacements: [reviewerId, at, versionId], type: QueryTypes.UPDATE, transaction: t,
        });
        const [row] = await sequelize.query<Record<string, any>>('SELECT * FROM spectrum_version WHERE id = ?', { replacements: [versionId], type: QueryTypes.SELECT, transaction: t });
        const signatureId = await q('signature', {
          signerId: reviewerId, signerName: plan.reviewer.name, meaning: APPROVAL_MEANING, subjectType: 'spectrum_version',
          subjectId: versionId, contentDigest: versionDigest(row), signedAt: at,
        });
        counts.signatures++;
        await audit(plan.reviewer, {
          action: 'spectrum.approve', targetType: 'spectrum_version', targetId: versionId, recordId, version,
          details: {
            before: { status: 'in_review', approvedBy: null }, after: { status: 'released', approvedBy: reviewerId },
            signature: { id: signatureId, signer: plan.reviewer.name, meaning: APPROVAL_MEANING, signedAt: at.toISOString() }, comment: null,
          },
        });
      };
      const submit = async (version: number, versionId: number) => {
        await sequelize.query("UPDATE spectrum_version SET status = 'in_review', submittedBy = ?, submittedAt = ? WHERE id = ?", {
          replacements: [importerId, new Date(), versionId], type: QueryTypes.UPDATE, transaction: t,
        });
        await audit(plan.importer, {
          action: 'spectrum.submit', targetType: 'spectrum_version', targetId: versionId, recordId, version,
          details: { before: { status: 'draft' }, after: { status: 'in_review' } },
        });
      };

      const v1 = await addVersion(1, { status: 'draft' });
      await audit(plan.importer, {
        action: 'spectrum.import', targetType: 'spectrum_version', targetId: v1, recordId, version: 1,
        details: {
          source: 'demo seed', synthetic: true,
          after: { status: 'draft', name: c.name, formula: chem.formula, casRegistryNo: c.cas ?? null, contentHash: base.contentHash, peakCount: peaks.length },
        },
      });
      if (plan.status !== 'draft') await submit(1, v1);
      if (plan.status === 'released') await release(1, v1);
      let latest = 1;
      let releasedVersion: number | null = plan.status === 'released' ? 1 : null;
      if (plan.status === 'released' && plan.second) {
        const reason = `Second acquisition on ${INSTRUMENTS[(index + 1) % INSTRUMENTS.length]}; instrument field updated`;
        const v2 = await addVersion(2, { status: 'draft', instrument: INSTRUMENTS[(index + 1) % INSTRUMENTS.length], changeReason: reason });
        latest = 2;
        await audit(plan.importer, {
          action: 'spectrum.new_version', targetType: 'spectrum_version', targetId: v2, recordId, version: 2, reason,
          details: { fields: ['instrument'], before: { instrument }, after: { instrument: INSTRUMENTS[(index + 1) % INSTRUMENTS.length] }, from: 1 },
        });
        if (plan.second !== 'draft') await submit(2, v2);
        if (plan.second === 'released') {
          await sequelize.query("UPDATE spectrum_version SET status = 'superseded' WHERE id = ?", { replacements: [v1], type: QueryTypes.UPDATE, transaction: t });
          await audit(plan.reviewer, {
            action: 'spectrum.supersede', targetType: 'spectrum_version', targetId: v1, recordId, version: 1,
            details: { before: { status: 'released' }, after: { status: 'superseded' }, supersededBy: 2 },
          });
          await release(2, v2);
          releasedVersion = 2;
        }
      }
      await sequelize.query('UPDATE spectrum_record SET latestVersion = ?, releasedVersion = ? WHERE id = ?', {
        replacements: [latest, releasedVersion, recordId], type: QueryTypes.UPDATE, transaction: t,
      });
      if (releasedVersion !== null) counts.released++;
      else if (plan.status === 'in_review') counts.inReview++;
      else counts.draft++;

      for (const name of recordTags(c, chem.elements)) {
        await q('record_tag', { recordId, tagId: await tagId(name) });
      }
      if ((index + 1) % 50 === 0) log(`records: ${index + 1} of ${DEMO_COMPOUNDS.length}`);
    }

    // The lab's default settings.
    const adminId = ids.get(admin.key)!;
    const settings = [
      { name: 'search-defaults', value: { rankBy: 'composite', weights: { mz: 3, intensity: 0.6 } } },
      { name: 'acceptance-criteria', value: { minScore: 0.8, riWindow: 20, keyIons: { count: 5, tolerance: 0.2 }, isomerMargin: 0.02 } },
    ];
    for (const s of settings) {
      const id = await q('setting', { name: s.name, version: 1, value: s.value, createdBy: adminId, createdAt: now });
      counts.settings++;
      await audit(admin, { action: 'setting.create', targetType: 'setting', targetId: id, details: { name: s.name, version: 1, after: s.value } });
    }

    await sequelize.query('UPDATE library_state SET version = 1, updatedAt = ? WHERE id = 1', { replacements: [new Date()], type: QueryTypes.UPDATE, transaction: t });
    // Identification reports in every state (seeds/reports.ts).
    counts.auditEvents += (await seedDemoReports(sequelize, { transaction: t, log })).auditEvents;
    counts.auditEvents++;
    await appendAudit({
      actorId: adminId, actorEmail: admin.email, action: 'demo.seed', targetType: 'library',
      details: { lab: DEMO_LAB, counts: { ...counts }, note: 'Demo scenario: invented laboratory and people, synthetic spectra not for identification' },
    }, t);
    log(`seeded: ${JSON.stringify(counts)}`);
    return { seeded: true, counts };
  });
}

/** The record's tags: its class, what its elements and structure say, its own extras, and the demo mark. */
export function recordTags(c: DemoCompound, elements: string): string[] {
  const tags = new Set<string>([c.cls, DEMO_TAG, ...(c.tags ?? [])]);
  const els = elements.split(',');
  if (els.some((e) => e === 'Cl' || e === 'Br' || e === 'I')) tags.add('halogenated');
  if (els.includes('F')) tags.add('fluorinated');
  if (/c/.test(c.smiles.replace(/Cl/g, ''))) tags.add('aromatic');
  return [...tags];
}
