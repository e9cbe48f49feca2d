// Curation: the JCAMP-DX import pipeline, record versions and the review
// workflow, tags, and JCAMP-DX export. Routes stay thin and call these.
export * from './types';
export { importFile, type ImportFileOptions, type ImportFileResult } from './importFile';
export { runImport, getBatch, confirmFile, createBatch, type UploadedFile, type RunImportOptions } from './batch';
export { editRecord, reviewRecord, versionDigest, touchedVersion, APPROVAL_MEANING, type EditResult, type ReviewInput, type ReviewResult } from './workflow';
export { patchSchema, editFieldsShape, retentionIndexSchema, EDIT_FIELDS, type PatchInput, type EditFields, type EditField } from './editSchema';
export { listTags, createTag, updateTag, mergeTag, assignTags, setRecordTags, COLOUR_PATTERN, DEFAULT_TAG_COLOUR, type TagView } from './tags';
export { exportRecordJcamp, loadVersionForRead, versionToJcampInput } from './exportJcamp';
export { reviewQueue, type ReviewItem, type FieldDiff } from './reviewQueue';
export { deriveChemistry, type DerivedChemistry } from './chemistry';
export { compoundNameKey } from './compoundKey';
export { unitCosine } from './unitCosine';
export { actorFromLocals } from './actor';
