// Identification reports: snapshot, acceptance criteria, review workflow,
// integrity, notices, print and PDF.
export * from './types';
export { reportLabel } from './reportLabel';
export { evaluateCriteria, compareKeyIons, findAlternatives, conclusionProblems, unitRelative, mentions } from './evaluateCriteria';
export { reportContent, reportHmac, integrityOf, contentDigest, SIGNED_FIELDS } from './integrity';
export { headToTailSvg } from './headToTailSvg';
export { DEFAULT_ACCEPTANCE_CRITERIA, getAcceptanceCriteria, listSettings, putSetting, SETTING_NAMES } from './settings';
export { createReport, updateReport, reviewReport, evaluateForReport, storedContent } from './workflow';
export { getReportView, listReports, reportsCsv } from './view';
export { canView, visibilityWhere, readCitedVersion, reviewersFor } from './store';
