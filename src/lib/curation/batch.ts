// Import batches: the per-file state that progress bars poll (queued,
// processing, then the final status), the reports, and the files kept for a
// later page selection or confirmation.
import crypto from 'node:crypto';
import fs from 'node:fs/promises';
import { getModels } from '../db/index';
import { HttpError } from '../http';
import { importFile, type ImportFileOptions } from './importFile';
import type { Actor, BatchFileState, FileReport, PageSelection } from './types';

export interface UploadedFile {
  /** the name the client gave */
  name: string;
  /** where multer put it (deleted once read), or the bytes themselves */
  path?: string;
  bytes?: Uint8Array;
  size?: number;
}

export interface RunImportOptions {
  actor: Actor;
  files: UploadedFile[];
  /** NTUPLES page selections by file name */
  pages?: Record<string, PageSelection>;
  source?: 'web' | 'cli' | 'api';
  /** add to this batch (created when it does not exist yet) instead of starting one */
  batchId?: string | null;
  /** called after each file, for progress output */
  onFile?: (report: FileReport, index: number, total: number) => void;
  /** passed to importFile */
  importOptions?: Partial<Pick<ImportFileOptions, 'maxAutoPages' | 'nearDuplicateCosine' | 'synthetic'>>;
  /** delete each file from disk once it has been read @default true */
  removeFiles?: boolean;
}

export interface BatchFileView {
  id: number;
  file: string;
  status: BatchFileState;
  report: FileReport | null;
}

/**
 * Start a batch, or add files to one. A client may name a new batch itself
 * (a UUID) so that it can poll GET /api/imports/:batchId while its upload runs.
 */
export async function createBatch(actor: Actor, fileNames: { name: string; size: number }[], source: string, batchId?: string | null) {
  const m = getModels();
  const now = new Date();
  const id = batchId ?? crypto.randomUUID();
  const append = async () => {
    await m.ImportBatch.increment('fileCount', { by: fileNames.length, where: { id } });
    await m.ImportBatch.update({ updatedAt: now }, { where: { id } });
  };
  if (batchId && (await m.ImportBatch.findByPk(id))) {
    await append();
  } else {
    try {
      await m.ImportBatch.create({ id, createdBy: actor.id, fileCount: fileNames.length, source, createdAt: now, updatedAt: now });
    } catch (e) {
      // two uploads naming the same new batch at once: the second joins it
      if ((e as Error).name !== 'SequelizeUniqueConstraintError') throw e;
      await append();
    }
  }
  const rows = fileNames.length
    ? await m.ImportFile.bulkCreate(fileNames.map((f) => ({
        batchId: id, fileName: f.name.slice(0, 255) || '(no name)', size: Math.min(f.size, 2 ** 31 - 1), status: 'queued', createdAt: now, updatedAt: now,
      })))
    : [];
  return { batchId: id, fileIds: rows.map((r) => Number(r.get('id'))) };
}

async function readUpload(f: UploadedFile, remove: boolean): Promise<Uint8Array> {
  if (f.bytes) return f.bytes;
  if (!f.path) return new Uint8Array();
  try {
    return await fs.readFile(f.path);
  } finally {
    // out of quarantine once read
    if (remove) await fs.rm(f.path, { force: true }).catch(() => {});
  }
}

/** Import the files one after another, each in its own transaction; returns the per-file reports. */
export async function runImport(opts: RunImportOptions): Promise<{ batchId: string; files: FileReport[] }> {
  const { actor, files, pages = {}, source = 'web', onFile, importOptions = {}, removeFiles = true } = opts;
  const m = getModels();
  const { batchId, fileIds } = await createBatch(actor, files.map((f) => ({ name: f.name, size: f.size ?? f.bytes?.length ?? 0 })), source, opts.batchId);
  const reports: FileReport[] = [];
  try {
    for (let i = 0; i < files.length; i++) {
      const f = files[i];
      const rowId = fileIds[i];
      await m.ImportFile.update({ status: 'processing', updatedAt: new Date() }, { where: { id: rowId } });
      let bytes: Uint8Array;
      try {
        bytes = await readUpload(f, removeFiles);
      } catch (e) {
        bytes = new Uint8Array();
      }
      const sha256 = crypto.createHash('sha256').update(bytes).digest('hex');
      const { report, pendingText } = await importFile({
        fileName: f.name, bytes, actor, batchId, pages: pages[f.name], ...importOptions,
      });
      await m.ImportFile.update(
        { status: report.status, report, error: report.error ?? null, pending: pendingText, sha256, size: bytes.length, updatedAt: new Date() },
        { where: { id: rowId } },
      );
      reports.push(report);
      onFile?.(report, i, files.length);
    }
  } finally {
    if (removeFiles) for (const f of files) if (f.path) await fs.rm(f.path, { force: true }).catch(() => {});
  }
  return { batchId, files: reports };
}

export async function getBatch(batchId: string) {
  const m = getModels();
  const batch = await m.ImportBatch.findByPk(batchId);
  if (!batch) throw new HttpError(404, 'not_found', `No import batch ${batchId}`);
  const rows = await m.ImportFile.findAll({ where: { batchId }, order: [['id', 'ASC']], attributes: { exclude: ['pending'] } });
  const files = rows.map((r) => {
    const report = (typeof r.get('report') === 'string' ? JSON.parse(r.get('report') as string) : r.get('report')) as FileReport | null;
    const status = r.get('status') as BatchFileState;
    return report ? { id: Number(r.get('id')), ...report, status } : { id: Number(r.get('id')), file: String(r.get('fileName')), status };
  });
  const done = files.every((f) => f.status !== 'queued' && f.status !== 'processing');
  const counts: Record<string, number> = {};
  for (const f of files) counts[f.status] = (counts[f.status] ?? 0) + 1;
  return {
    batchId, source: batch.get('source'), createdBy: batch.get('createdBy'), createdAt: batch.get('createdAt'),
    fileCount: files.length, done, counts, files,
  };
}

/**
 * Store a kept file: one that needed confirmation (same peaks under another
 * compound) or a page selection (a large NTUPLES run).
 */
export async function confirmFile(batchId: string, fileName: string, actor: Actor, pages?: PageSelection): Promise<FileReport> {
  const m = getModels();
  const batch = await m.ImportBatch.findByPk(batchId);
  if (!batch) throw new HttpError(404, 'not_found', `No import batch ${batchId}`);
  const rows = await m.ImportFile.findAll({ where: { batchId, fileName }, order: [['id', 'ASC']] });
  if (rows.length === 0) throw new HttpError(404, 'not_found', `No file "${fileName}" in import batch ${batchId}`);
  const row = rows.find((r) => ['needs_confirmation', 'needs_selection'].includes(String(r.get('status'))));
  if (!row) {
    throw new HttpError(409, 'wrong_state', `"${fileName}" is ${rows.map((r) => r.get('status')).join(', ')}: only a file that needs confirmation or a page selection can be confirmed`);
  }
  const status = String(row.get('status'));
  const text = row.get('pending') as string | null;
  if (!text) throw new HttpError(409, 'wrong_state', `"${fileName}" is no longer kept; upload it again`);
  if (status === 'needs_selection' && pages === undefined) {
    throw new HttpError(400, 'pages_required', `"${fileName}" is a run with many pages: say which pages to keep ("pages": [1, 3] or "all")`);
  }
  const prev = (typeof row.get('report') === 'string' ? JSON.parse(row.get('report') as string) : row.get('report')) as FileReport | null;
  const { report, pendingText } = await importFile({
    fileName, text, actor, batchId,
    pages: pages ?? previousSelection(prev),
    confirmed: status === 'needs_confirmation',
  });
  await row.update({ status: report.status, report, error: report.error ?? null, pending: pendingText, updatedAt: new Date() });
  return report;
}

/** The pages a kept file was first imported with (all of them when none were skipped). */
function previousSelection(prev: FileReport | null): PageSelection {
  const paged = (prev?.found ?? []).filter((f) => f.page !== null);
  if (paged.length === 0 || !paged.some((f) => f.outcome === 'skipped')) return 'all';
  return paged.filter((f) => f.outcome !== 'skipped').map((f) => f.page as number);
}
