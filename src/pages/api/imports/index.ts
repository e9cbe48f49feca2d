// POST /api/imports — multipart upload (multer in scripts/serve.ts puts the
// files in quarantine and hands them over in locals); each file is imported
// in its own transaction and gets a report (API.md).
import type { APIRoute } from 'astro';
import fs from 'node:fs/promises';
import { z } from 'zod';
import { apiError, handle, HttpError, json, parseWith } from '../../../lib/http';
import { syncLibraryIndex } from '../../../lib/library-index';
import { actorFromLocals, runImport } from '../../../lib/curation';

const pageSelection = z.union([z.literal('all'), z.array(z.number().int().positive()).min(1).max(100000)]);
const pagesSchema = z.record(z.string(), pageSelection);

export const POST: APIRoute = handle(async ({ locals }) => {
  const uploads: { originalname: string; path: string; size: number }[] = locals.uploads ?? [];
  // out of quarantine whatever happens (runImport removes each file once read)
  const removeAll = () => Promise.all(uploads.map((f) => fs.rm(f.path, { force: true }).catch(() => {})));
  if (locals.uploadError) {
    await removeAll();
    return apiError(locals.uploadError.status, locals.uploadError.code, locals.uploadError.message);
  }
  try {
    if (locals.uploads === undefined) {
      throw new HttpError(400, 'multipart_required', 'Send the files as multipart/form-data in the field "files"');
    }
    if (uploads.length === 0) throw new HttpError(400, 'no_files', 'No files: send one or more in the field "files"');
    const fields = locals.uploadFields ?? {};
    let pages: Record<string, 'all' | number[]> = {};
    if (fields.pages !== undefined && fields.pages !== '') {
      let raw: unknown;
      try {
        raw = JSON.parse(fields.pages);
      } catch {
        throw new HttpError(400, 'invalid_input', 'pages: not valid JSON (expected { "<file name>": [1, 3] | "all" })', [{ field: 'pages', message: 'not valid JSON' }]);
      }
      pages = parseWith(pagesSchema, raw) as Record<string, 'all' | number[]>;
    }
    const batchId = fields.batchId ? parseWith(z.string().uuid(), fields.batchId) : null;
    const result = await runImport({
      actor: actorFromLocals(locals),
      files: uploads.map((u: { originalname: string; path: string; size: number }) => ({ name: u.originalname, path: u.path, size: u.size })),
      pages,
      batchId,
      source: locals.apiKeyId ? 'api' : 'web',
    });
    if (result.files.some((f) => f.status === 'imported')) await syncLibraryIndex().catch(() => {});
    return json(result);
  } finally {
    await removeAll();
  }
});
