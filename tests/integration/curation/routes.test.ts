// The curation routes' glue, called as Astro calls them (a context with
// params, request and locals): the 413 of an upload over a limit, bad input
// as API.md's error shape, files removed from quarantine, batch state,
// confirm, review, PATCH, tags, JCAMP-DX export.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import { POST as postImports } from '../../../src/pages/api/imports/index';
import { GET as getBatchRoute } from '../../../src/pages/api/imports/[batchId]/index';
import { POST as confirmRoute } from '../../../src/pages/api/imports/[batchId]/confirm';
import { POST as reviewRoute } from '../../../src/pages/api/spectra/[id]/review';
import { GET as jcampRoute } from '../../../src/pages/api/spectra/[id]/jcamp';
import { PATCH as patchRoute } from '../../../src/lib/curation/patch-route';
import { GET as listTagsRoute, POST as createTagRoute } from '../../../src/pages/api/tags/index';
import { PATCH as patchTagRoute } from '../../../src/pages/api/tags/[id]/index';
import { POST as mergeTagRoute } from '../../../src/pages/api/tags/[id]/merge';
import { POST as assignRoute } from '../../../src/pages/api/tags/assign';
import type { Actor } from '../../../src/lib/curation';
import { RUN, PASSWORD, createUser, peakTableFile, rng, randomPeaks } from './helpers';

const sequelize = useTestDatabase();
afterAll(() => closeSequelize());

let curator: Actor;
let other: Actor;
let viewer: Actor;
const next = rng(5150);
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-quarantine-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

beforeAll(async () => {
  curator = await createUser(sequelize, 'route-curator', ['curator']);
  other = await createUser(sequelize, 'route-curator-2', ['curator']);
  viewer = await createUser(sequelize, 'route-viewer', ['viewer']);
});

const localsOf = (a: Actor, extra: Record<string, unknown> = {}) => ({ user: { id: a.id!, email: a.email, name: a.name, roles: [...a.roles] }, session: null, apiKeyId: null, ...extra });
const ctx = (opts: { actor: Actor; params?: Record<string, string>; body?: unknown; method?: string; url?: string; locals?: Record<string, unknown> }) => ({
  params: opts.params ?? {},
  url: new URL(opts.url ?? 'http://127.0.0.1/api/x'),
  request: new Request(opts.url ?? 'http://127.0.0.1/api/x', {
    method: opts.method ?? 'POST',
    headers: { 'content-type': 'application/json' },
    body: opts.body === undefined || opts.method === 'GET' ? undefined : JSON.stringify(opts.body),
  }),
  locals: localsOf(opts.actor, opts.locals),
});
const call = async (route: any, c: unknown) => {
  const res: Response = await route(c);
  const text = await res.text();
  let body: any = text;
  try { body = JSON.parse(text); } catch { /* not JSON */ }
  return { status: res.status, body, headers: res.headers };
};

function quarantined(name: string, text: string) {
  const p = path.join(dir, `${Date.now()}-${Math.random().toString(36).slice(2)}.upload`);
  fs.writeFileSync(p, text);
  return { originalname: name, path: p, size: Buffer.byteLength(text) };
}

describe('POST /api/imports', () => {
  it('answers an upload over a limit with 413 and the limit it hit', async () => {
    const r = await call(postImports, ctx({ actor: curator, locals: { uploads: [], uploadFields: {}, uploadError: { status: 413, code: 'file_size_limit', message: 'A file is over the size limit of 25 MB' } } }));
    expect(r.status).toBe(413);
    expect(r.body).toEqual({ error: { code: 'file_size_limit', message: 'A file is over the size limit of 25 MB' } });
  });

  it('answers no files and bad pages JSON with 400, and removes the uploaded files', async () => {
    expect((await call(postImports, ctx({ actor: curator, locals: { uploads: [], uploadFields: {} } }))).body.error.code).toBe('no_files');
    expect((await call(postImports, ctx({ actor: curator }))).body.error.code).toBe('multipart_required');
    const f = quarantined('a.jdx', 'x');
    const bad = await call(postImports, ctx({ actor: curator, locals: { uploads: [f], uploadFields: { pages: '{not json' } } }));
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('pages');
    expect(fs.existsSync(f.path)).toBe(false);
  });

  it('imports each file, reports, removes them from quarantine; the batch and confirm routes follow', async () => {
    const peaks = randomPeaks(next);
    await call(postImports, ctx({ actor: curator, locals: { uploads: [quarantined('first.jdx', peakTableFile({ title: `Route first ${RUN}`, formula: 'C6H14', peaks }))], uploadFields: {} } }));
    const files = [
      quarantined('good.jdx', peakTableFile({ title: `Route good ${RUN}`, formula: 'C7H16', peaks: randomPeaks(next) })),
      quarantined('lookalike.jdx', peakTableFile({ title: `Route look-alike ${RUN}`, formula: 'C6H12', peaks })),
      quarantined('bad.jdx', 'not a spectrum'),
    ];
    const r = await call(postImports, ctx({ actor: curator, locals: { uploads: files, uploadFields: {} } }));
    expect(r.status).toBe(200);
    expect(r.body.files.map((f: any) => [f.file, f.status])).toEqual([['good.jdx', 'imported'], ['lookalike.jdx', 'needs_confirmation'], ['bad.jdx', 'rejected']]);
    expect(r.body.files[2].error).toMatch(/not a JCAMP-DX/);
    for (const f of files) expect(fs.existsSync(f.path)).toBe(false);

    const batch = await call(getBatchRoute, ctx({ actor: curator, method: 'GET', params: { batchId: r.body.batchId } }));
    expect(batch.body.files.map((f: any) => f.status)).toEqual(['imported', 'needs_confirmation', 'rejected']);
    expect(batch.body.done).toBe(true);
    expect((await call(getBatchRoute, ctx({ actor: curator, method: 'GET', params: { batchId: 'nope' } }))).status).toBe(400);
    expect((await call(getBatchRoute, ctx({ actor: curator, method: 'GET', params: { batchId: '00000000-0000-4000-8000-000000000000' } }))).status).toBe(404);

    const confirmed = await call(confirmRoute, ctx({ actor: curator, params: { batchId: r.body.batchId }, body: { file: 'lookalike.jdx' } }));
    expect(confirmed.status).toBe(200);
    expect(confirmed.body).toMatchObject({ batchId: r.body.batchId, file: 'lookalike.jdx', status: 'imported' });
    expect((await call(confirmRoute, ctx({ actor: curator, params: { batchId: r.body.batchId }, body: { file: 'bad.jdx' } }))).status).toBe(409);
    expect((await call(confirmRoute, ctx({ actor: curator, params: { batchId: r.body.batchId }, body: { file: 'ghost.jdx' } }))).status).toBe(404);
  });
});

describe('a batch named by the client', () => {
  it('is created on the first upload and grows with the next, so it can be polled meanwhile', async () => {
    const batchId = crypto.randomUUID();
    const one = await call(postImports, ctx({ actor: curator, locals: { uploads: [quarantined('n1.jdx', peakTableFile({ title: `Named 1 ${RUN}`, formula: 'C5H10', peaks: randomPeaks(next) }))], uploadFields: { batchId } } }));
    expect(one.body.batchId).toBe(batchId);
    const two = await call(postImports, ctx({ actor: curator, locals: { uploads: [quarantined('n2.jdx', peakTableFile({ title: `Named 2 ${RUN}`, formula: 'C5H12', peaks: randomPeaks(next) }))], uploadFields: { batchId } } }));
    expect(two.body.batchId).toBe(batchId);
    const batch = await call(getBatchRoute, ctx({ actor: curator, method: 'GET', params: { batchId } }));
    expect(batch.body.files.map((f: any) => [f.file, f.status])).toEqual([['n1.jdx', 'imported'], ['n2.jdx', 'imported']]);
    expect(batch.body.fileCount).toBe(2);
    const bad = await call(postImports, ctx({ actor: curator, locals: { uploads: [quarantined('n3.jdx', 'x')], uploadFields: { batchId: 'not-a-uuid' } } }));
    expect(bad.status).toBe(400);
  });
});

describe('record routes', () => {
  it('PATCH, review and export through the routes', async () => {
    const up = await call(postImports, ctx({ actor: curator, locals: { uploads: [quarantined('rec.jdx', peakTableFile({ title: `Route record ${RUN}`, formula: 'C8H18', peaks: randomPeaks(next) }))], uploadFields: {} } }));
    const id = String(up.body.files[0].spectra[0].id);
    const bad = await call(patchRoute, ctx({ actor: curator, method: 'PATCH', params: { id }, body: { formula: 'Zz9' } }));
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([{ field: 'formula', message: expect.any(String) }]);
    expect((await call(patchRoute, ctx({ actor: curator, method: 'PATCH', params: { id }, body: { unknownField: 1 } }))).status).toBe(400);
    const ok = await call(patchRoute, ctx({ actor: curator, method: 'PATCH', params: { id }, body: { ionizationEnergy: '70', notes: 'via route', tags: [`route ${RUN}`] } }));
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ version: 1, createdVersion: false, tags: [`route ${RUN}`] });

    expect((await call(reviewRoute, ctx({ actor: curator, params: { id }, body: { action: 'publish' } }))).status).toBe(400);
    expect((await call(reviewRoute, ctx({ actor: curator, params: { id }, body: { action: 'submit' } }))).body.status).toBe('in_review');
    expect((await call(reviewRoute, ctx({ actor: curator, params: { id }, body: { action: 'approve', password: PASSWORD } }))).status).toBe(403);
    expect((await call(reviewRoute, ctx({ actor: other, params: { id }, body: { action: 'approve' } }))).body.error.code).toBe('password_required');
    const approved = await call(reviewRoute, ctx({ actor: other, params: { id }, body: { action: 'approve', password: PASSWORD } }));
    expect(approved.body).toMatchObject({ status: 'released', signature: { signerName: other.name, meaning: 'reviewed and approved for release' } });

    const exported = await call(jcampRoute, ctx({ actor: viewer, method: 'GET', params: { id }, url: `http://127.0.0.1/api/spectra/${id}/jcamp?version=1` }));
    expect(exported.status).toBe(200);
    expect(exported.headers.get('content-type')).toMatch(/chemical\/x-jcamp-dx/);
    expect(exported.headers.get('content-disposition')).toMatch(/attachment; filename=".*\.jdx"/);
    expect(exported.body).toContain(`##NAMES=Route record ${RUN}`);
    expect((await call(jcampRoute, ctx({ actor: viewer, method: 'GET', params: { id }, url: `http://127.0.0.1/api/spectra/${id}/jcamp?version=9` }))).status).toBe(404);
  });
});

describe('tag routes', () => {
  it('create, list, rename, merge, assign', async () => {
    const a = await call(createTagRoute, ctx({ actor: curator, body: { name: `route tag A ${RUN}`, colour: '#336699' } }));
    expect(a.status).toBe(201);
    const b = await call(createTagRoute, ctx({ actor: curator, body: { name: `route tag B ${RUN}` } }));
    expect((await call(createTagRoute, ctx({ actor: curator, body: { name: `route tag B ${RUN}` } }))).status).toBe(409);
    expect((await call(createTagRoute, ctx({ actor: curator, body: { name: 'x', colour: 'blue' } }))).status).toBe(400);
    const renamed = await call(patchTagRoute, ctx({ actor: curator, method: 'PATCH', params: { id: String(a.body.id) }, body: { name: `route tag A2 ${RUN}` } }));
    expect(renamed.body.name).toBe(`route tag A2 ${RUN}`);
    expect((await call(patchTagRoute, ctx({ actor: curator, method: 'PATCH', params: { id: String(a.body.id) }, body: {} }))).status).toBe(400);
    const rec = await call(postImports, ctx({ actor: curator, locals: { uploads: [quarantined('tagged.jdx', peakTableFile({ title: `Route tagged ${RUN}`, formula: 'C9H20', peaks: randomPeaks(next) }))], uploadFields: {} } }));
    const rid = rec.body.files[0].spectra[0].id;
    const assigned = await call(assignRoute, ctx({ actor: curator, body: { recordIds: [rid], tagIds: [a.body.id], action: 'add' } }));
    expect(assigned.body.changed).toBe(1);
    expect((await call(assignRoute, ctx({ actor: curator, body: { recordIds: [rid], action: 'add' } }))).status).toBe(400);
    expect((await call(assignRoute, ctx({ actor: curator, body: { recordIds: [999999999], tagIds: [a.body.id], action: 'add' } }))).status).toBe(404);
    const merged = await call(mergeTagRoute, ctx({ actor: curator, params: { id: String(a.body.id) }, body: { into: b.body.id } }));
    expect(merged.body).toMatchObject({ id: b.body.id, recordCount: 1 });
    const list = await call(listTagsRoute, ctx({ actor: viewer, method: 'GET' }));
    const names = list.body.items.map((t: any) => t.name);
    expect(names).toContain(`route tag B ${RUN}`);
    expect(names).not.toContain(`route tag A2 ${RUN}`);
  });
});
