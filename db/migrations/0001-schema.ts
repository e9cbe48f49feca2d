// The whole data model: spectral records and versions, tags, imports,
// identification reports, signatures, settings, the hash-chained audit trail,
// mail kept by the local fake SMTP server, and the library version counter.
import { DataTypes, type QueryInterface } from 'sequelize';

const { INTEGER, BIGINT, STRING, TEXT, BOOLEAN, DOUBLE, JSON: JSONT, BLOB, CHAR } = DataTypes;
const DATE3 = 'DATETIME(3)' as unknown as typeof DataTypes.DATE;
const id = { type: INTEGER, primaryKey: true, autoIncrement: true, allowNull: false };
const userRef = { type: STRING(36), allowNull: true };
const created = { createdAt: { type: DATE3, allowNull: false } };
const stamps = { createdAt: { type: DATE3, allowNull: false }, updatedAt: { type: DATE3, allowNull: false } };
const opts = { charset: 'utf8mb4', collate: 'utf8mb4_bin', engine: 'InnoDB' };

export async function up({ context: qi }: { context: QueryInterface }) {
  // A compound identity: replicate spectra of one compound share it. Duplicate
  // detection looks compounds up by Hill formula and name or registry number.
  await qi.createTable('compound', {
    id,
    name: { type: STRING(255), allowNull: false },
    nameKey: { type: STRING(255), allowNull: false },
    formula: { type: STRING(120), allowNull: true },
    casRegistryNo: { type: STRING(20), allowNull: true },
    ...stamps,
  }, opts);
  await qi.addIndex('compound', ['formula', 'nameKey'], { name: 'compound_formula_name' });
  await qi.addIndex('compound', ['casRegistryNo'], { name: 'compound_cas' });

  // A record: the stable id that reports cite together with a version number.
  await qi.createTable('spectrum_record', {
    id,
    compoundId: { type: INTEGER, allowNull: false, references: { model: 'compound', key: 'id' } },
    latestVersion: { type: INTEGER, allowNull: false, defaultValue: 1 },
    releasedVersion: { type: INTEGER, allowNull: true },
    synthetic: { type: BOOLEAN, allowNull: false, defaultValue: false },
    createdBy: userRef,
    ...stamps,
  }, opts);

  // A version is a complete, self-contained snapshot of compound identity,
  // acquisition metadata and peaks, so old versions stay readable as they were.
  await qi.createTable('spectrum_version', {
    id,
    recordId: { type: INTEGER, allowNull: false, references: { model: 'spectrum_record', key: 'id' }, onDelete: 'CASCADE' },
    version: { type: INTEGER, allowNull: false },
    status: { type: STRING(16), allowNull: false, defaultValue: 'draft' },
    // compound identity
    name: { type: STRING(255), allowNull: false },
    synonyms: { type: JSONT, allowNull: false, defaultValue: [] },
    formula: { type: STRING(120), allowNull: true },
    nominalMass: { type: INTEGER, allowNull: true },
    monoisotopicMass: { type: DOUBLE, allowNull: true },
    averageMass: { type: DOUBLE, allowNull: true },
    ihd: { type: DOUBLE, allowNull: true },
    elements: { type: STRING(120), allowNull: true },
    smiles: { type: TEXT, allowNull: true },
    molfile: { type: TEXT('medium'), allowNull: true },
    casRegistryNo: { type: STRING(20), allowNull: true },
    derivative: { type: STRING(120), allowNull: true },
    parentCompound: { type: STRING(255), allowNull: true },
    saltForm: { type: STRING(120), allowNull: true },
    // acquisition
    technique: { type: STRING(40), allowNull: false, defaultValue: 'EI-MS' },
    ionizationMode: { type: STRING(40), allowNull: true },
    ionizationEnergy: { type: DOUBLE, allowNull: true },
    instrument: { type: STRING(255), allowNull: true },
    analyzerType: { type: STRING(80), allowNull: true },
    sourceTemperature: { type: DOUBLE, allowNull: true },
    massRangeMin: { type: DOUBLE, allowNull: true },
    massRangeMax: { type: DOUBLE, allowNull: true },
    method: { type: STRING(255), allowNull: true },
    retentionTime: { type: DOUBLE, allowNull: true },
    referenceLot: { type: STRING(120), allowNull: true },
    referencePurity: { type: STRING(60), allowNull: true },
    acquiredAt: { type: STRING(40), allowNull: true },
    acquiredBy: { type: STRING(255), allowNull: true },
    origin: { type: STRING(255), allowNull: true },
    owner: { type: STRING(255), allowNull: true },
    notes: { type: TEXT, allowNull: true },
    metadata: { type: JSONT, allowNull: false, defaultValue: {} },
    // peaks, packed: see src/lib/spectra (encodePeaks / decodePeaks)
    peaks: { type: BLOB('medium'), allowNull: false },
    peakCount: { type: INTEGER, allowNull: false },
    basePeakMz: { type: DOUBLE, allowNull: true },
    contentHash: { type: CHAR(64), allowNull: false },
    sourceText: { type: TEXT('long'), allowNull: true },
    sourceFileName: { type: STRING(255), allowNull: true },
    importBatchId: { type: STRING(36), allowNull: true },
    synthetic: { type: BOOLEAN, allowNull: false, defaultValue: false },
    // workflow
    createdBy: userRef,
    editors: { type: JSONT, allowNull: false, defaultValue: [] },
    submittedBy: userRef,
    submittedAt: { type: DATE3, allowNull: true },
    approvedBy: userRef,
    approvedAt: { type: DATE3, allowNull: true },
    retiredAt: { type: DATE3, allowNull: true },
    changeReason: { type: TEXT, allowNull: true },
    ...stamps,
  }, opts);
  await qi.addIndex('spectrum_version', ['recordId', 'version'], { unique: true, name: 'spectrum_version_record_version' });
  await qi.addIndex('spectrum_version', ['status'], { name: 'spectrum_version_status' });
  await qi.addIndex('spectrum_version', ['contentHash'], { name: 'spectrum_version_hash' });
  await qi.addIndex('spectrum_version', ['formula'], { name: 'spectrum_version_formula' });
  await qi.addIndex('spectrum_version', ['nominalMass'], { name: 'spectrum_version_nominal' });

  // Retention indices, several a version, each for a stationary-phase class.
  await qi.createTable('retention_index', {
    id,
    spectrumVersionId: { type: INTEGER, allowNull: false, references: { model: 'spectrum_version', key: 'id' }, onDelete: 'CASCADE' },
    phase: { type: STRING(40), allowNull: false },
    value: { type: DOUBLE, allowNull: false },
    ladder: { type: STRING(255), allowNull: true },
    column: { type: STRING(255), allowNull: true },
  }, opts);
  await qi.addIndex('retention_index', ['spectrumVersionId'], { name: 'retention_index_version' });

  await qi.createTable('tag', {
    id,
    name: { type: STRING(80), allowNull: false, unique: true },
    colour: { type: STRING(16), allowNull: false, defaultValue: '#2f6f73' },
    ...stamps,
  }, opts);
  // Tags classify a record; they are not part of its measured identity, so a
  // tag change is audited but does not create a new version.
  await qi.createTable('record_tag', {
    recordId: { type: INTEGER, allowNull: false, primaryKey: true, references: { model: 'spectrum_record', key: 'id' }, onDelete: 'CASCADE' },
    tagId: { type: INTEGER, allowNull: false, primaryKey: true, references: { model: 'tag', key: 'id' }, onDelete: 'CASCADE' },
  }, opts);

  await qi.createTable('import_batch', {
    id: { type: STRING(36), primaryKey: true, allowNull: false },
    createdBy: userRef,
    fileCount: { type: INTEGER, allowNull: false, defaultValue: 0 },
    source: { type: STRING(20), allowNull: false, defaultValue: 'web' },
    ...stamps,
  }, opts);
  await qi.createTable('import_file', {
    id,
    batchId: { type: STRING(36), allowNull: false, references: { model: 'import_batch', key: 'id' }, onDelete: 'CASCADE' },
    fileName: { type: STRING(255), allowNull: false },
    size: { type: INTEGER, allowNull: false, defaultValue: 0 },
    sha256: { type: CHAR(64), allowNull: true },
    status: { type: STRING(24), allowNull: false, defaultValue: 'queued' },
    report: { type: JSONT, allowNull: true },
    error: { type: TEXT, allowNull: true },
    pending: { type: TEXT('long'), allowNull: true },
    ...stamps,
  }, opts);
  await qi.addIndex('import_file', ['batchId'], { name: 'import_file_batch' });

  await qi.createTable('report', {
    id,
    title: { type: STRING(255), allowNull: false },
    status: { type: STRING(16), allowNull: false, defaultValue: 'draft' },
    authorId: { type: STRING(36), allowNull: false },
    reviewerId: userRef,
    conclusion: { type: STRING(20), allowNull: true },
    reasoning: { type: TEXT, allowNull: true },
    sample: { type: JSONT, allowNull: false, defaultValue: {} },
    snapshot: { type: JSONT, allowNull: false },
    selectedRecordId: { type: INTEGER, allowNull: true },
    selectedVersion: { type: INTEGER, allowNull: true },
    criteria: { type: JSONT, allowNull: true },
    criteriaSettingsVersion: { type: INTEGER, allowNull: true },
    referenceStandard: { type: JSONT, allowNull: true },
    supersedesReportId: { type: INTEGER, allowNull: true },
    hmac: { type: CHAR(64), allowNull: true },
    submittedAt: { type: DATE3, allowNull: true },
    decidedAt: { type: DATE3, allowNull: true },
    ...stamps,
  }, opts);
  await qi.addIndex('report', ['status'], { name: 'report_status' });
  await qi.addIndex('report', ['authorId'], { name: 'report_author' });
  // The record versions a report cites; they stay readable whatever happens next.
  await qi.createTable('report_citation', {
    reportId: { type: INTEGER, allowNull: false, primaryKey: true, references: { model: 'report', key: 'id' }, onDelete: 'CASCADE' },
    recordId: { type: INTEGER, allowNull: false, primaryKey: true },
    version: { type: INTEGER, allowNull: false, primaryKey: true },
    role: { type: STRING(16), allowNull: false, defaultValue: 'hit' },
  }, opts);
  await qi.createTable('report_comment', {
    id,
    reportId: { type: INTEGER, allowNull: false, references: { model: 'report', key: 'id' }, onDelete: 'CASCADE' },
    authorId: { type: STRING(36), allowNull: false },
    action: { type: STRING(16), allowNull: true },
    body: { type: TEXT, allowNull: false },
    ...created,
  }, opts);

  // Electronic signatures: who signed what, meaning, UTC time, digest of content.
  await qi.createTable('signature', {
    id,
    signerId: { type: STRING(36), allowNull: false },
    signerName: { type: STRING(255), allowNull: false },
    meaning: { type: STRING(255), allowNull: false },
    subjectType: { type: STRING(24), allowNull: false },
    subjectId: { type: INTEGER, allowNull: false },
    contentDigest: { type: CHAR(64), allowNull: true },
    signedAt: { type: DATE3, allowNull: false },
  }, opts);
  await qi.addIndex('signature', ['subjectType', 'subjectId'], { name: 'signature_subject' });

  // Named, versioned settings (search defaults, acceptance criteria).
  await qi.createTable('setting', {
    id,
    name: { type: STRING(80), allowNull: false },
    version: { type: INTEGER, allowNull: false },
    value: { type: JSONT, allowNull: false },
    createdBy: userRef,
    ...created,
  }, opts);
  await qi.addIndex('setting', ['name', 'version'], { unique: true, name: 'setting_name_version' });

  // Append-only, hash-chained audit trail (UTC times). The app's database
  // account gets only INSERT and SELECT on it in production (README).
  await qi.createTable('audit_event', {
    id: { type: BIGINT, primaryKey: true, autoIncrement: true, allowNull: false },
    at: { type: DATE3, allowNull: false },
    actorId: { type: STRING(36), allowNull: true },
    actorEmail: { type: STRING(255), allowNull: true },
    action: { type: STRING(64), allowNull: false },
    targetType: { type: STRING(32), allowNull: true },
    targetId: { type: STRING(64), allowNull: true },
    recordId: { type: INTEGER, allowNull: true },
    version: { type: INTEGER, allowNull: true },
    reason: { type: TEXT, allowNull: true },
    details: { type: JSONT, allowNull: true },
    prevHash: { type: CHAR(64), allowNull: false },
    hash: { type: CHAR(64), allowNull: false, unique: true },
  }, opts);
  await qi.addIndex('audit_event', ['at'], { name: 'audit_event_at' });
  await qi.addIndex('audit_event', ['actorId'], { name: 'audit_event_actor' });
  await qi.addIndex('audit_event', ['recordId'], { name: 'audit_event_record' });

  // The head of the chain: locking this one row serialises appends.
  await qi.createTable('audit_head', {
    id: { type: INTEGER, primaryKey: true, allowNull: false },
    lastId: { type: BIGINT, allowNull: true },
    lastHash: { type: CHAR(64), allowNull: false },
  }, opts);
  await qi.bulkInsert('audit_head', [{ id: 1, lastId: null, lastHash: '0'.repeat(64) }]);

  // Messages captured by the built-in fake SMTP server (demo and tests).
  await qi.createTable('mail_message', {
    id,
    to: { type: TEXT, allowNull: false },
    from: { type: STRING(255), allowNull: true },
    subject: { type: STRING(500), allowNull: true },
    text: { type: TEXT('medium'), allowNull: true },
    html: { type: TEXT('medium'), allowNull: true },
    receivedAt: { type: DATE3, allowNull: false },
  }, opts);

  // One row: the library version. Every release, retire or new version bumps
  // it; every app server polls it to keep its in-memory index current.
  await qi.createTable('library_state', {
    id: { type: INTEGER, primaryKey: true, allowNull: false },
    version: { type: BIGINT, allowNull: false, defaultValue: 0 },
    updatedAt: { type: DATE3, allowNull: false },
  }, opts);
  await qi.bulkInsert('library_state', [{ id: 1, version: 0, updatedAt: new Date() }]);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const t of ['library_state', 'mail_message', 'audit_head', 'audit_event', 'setting', 'signature', 'report_comment', 'report_citation', 'report', 'import_file', 'import_batch', 'record_tag', 'tag', 'retention_index', 'spectrum_version', 'spectrum_record', 'compound']) {
    await qi.dropTable(t);
  }
}
