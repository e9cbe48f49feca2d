// The domain models, defined once per Sequelize instance, with their associations.
import type { Sequelize } from 'sequelize';
import { getSequelize } from './sequelize';
import { defineCompound } from './models/compound';
import { defineSpectrumRecord } from './models/spectrum-record';
import { defineSpectrumVersion } from './models/spectrum-version';
import { defineRetentionIndex } from './models/retention-index';
import { defineTag } from './models/tag';
import { defineRecordTag } from './models/record-tag';
import { defineImportBatch } from './models/import-batch';
import { defineImportFile } from './models/import-file';
import { defineReport } from './models/report';
import { defineReportCitation } from './models/report-citation';
import { defineReportComment } from './models/report-comment';
import { defineSignature } from './models/signature';
import { defineSetting } from './models/setting';
import { defineAuditEvent } from './models/audit-event';
import { defineMailMessage } from './models/mail-message';
import { defineLibraryState } from './models/library-state';
import { defineInvitation } from './models/invitation';
import { defineSignInFailure } from './models/sign-in-failure';
import { defineUser } from './models/user';

function defineAll(sequelize: Sequelize) {
  const m = {
    Compound: defineCompound(sequelize),
    SpectrumRecord: defineSpectrumRecord(sequelize),
    SpectrumVersion: defineSpectrumVersion(sequelize),
    RetentionIndex: defineRetentionIndex(sequelize),
    Tag: defineTag(sequelize),
    RecordTag: defineRecordTag(sequelize),
    ImportBatch: defineImportBatch(sequelize),
    ImportFile: defineImportFile(sequelize),
    Report: defineReport(sequelize),
    ReportCitation: defineReportCitation(sequelize),
    ReportComment: defineReportComment(sequelize),
    Signature: defineSignature(sequelize),
    Setting: defineSetting(sequelize),
    AuditEvent: defineAuditEvent(sequelize),
    MailMessage: defineMailMessage(sequelize),
    LibraryState: defineLibraryState(sequelize),
    Invitation: defineInvitation(sequelize),
    SignInFailure: defineSignInFailure(sequelize),
    User: defineUser(sequelize),
  };
  m.SpectrumRecord.belongsTo(m.Compound, { foreignKey: 'compoundId', as: 'compound' });
  m.SpectrumRecord.hasMany(m.SpectrumVersion, { foreignKey: 'recordId', as: 'versions' });
  m.SpectrumVersion.belongsTo(m.SpectrumRecord, { foreignKey: 'recordId', as: 'record' });
  m.SpectrumVersion.hasMany(m.RetentionIndex, { foreignKey: 'spectrumVersionId', as: 'retentionIndices' });
  m.SpectrumRecord.belongsToMany(m.Tag, { through: m.RecordTag, foreignKey: 'recordId', otherKey: 'tagId', as: 'tags' });
  m.Tag.belongsToMany(m.SpectrumRecord, { through: m.RecordTag, foreignKey: 'tagId', otherKey: 'recordId', as: 'records' });
  m.ImportBatch.hasMany(m.ImportFile, { foreignKey: 'batchId', as: 'files' });
  m.Report.hasMany(m.ReportCitation, { foreignKey: 'reportId', as: 'citations' });
  m.Report.hasMany(m.ReportComment, { foreignKey: 'reportId', as: 'comments' });
  return m;
}

export type Models = ReturnType<typeof defineAll>;
const cache = new WeakMap<Sequelize, Models>();

export function getModels(sequelize: Sequelize = getSequelize()): Models {
  let m = cache.get(sequelize);
  if (!m) {
    m = defineAll(sequelize);
    cache.set(sequelize, m);
  }
  return m;
}

export { getSequelize, closeSequelize, createSequelize, setSequelize } from './sequelize';
