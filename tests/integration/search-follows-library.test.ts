// The search index follows the library: a record released through the API is
// the top hit of its own spectrum within a second; retired, it is gone; its
// new released version replaces it.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import crypto from 'node:crypto';
import { hashPassword } from 'better-auth/crypto';
import { useTestDatabase } from '../helpers/db';
import { callRoute } from '../helpers/route';
import { closeSequelize } from '../../src/lib/db/sequelize';
import { getModels } from '../../src/lib/db';
import { importFile } from '../../src/lib/curation';
import { rebuildLibraryIndex, stopLibraryIndexPolling, getLibraryIndex } from '../../src/lib/library-index';
import { POST as review } from '../../src/pages/api/spectra/[id]/review';
import { PATCH as patch } from '../../src/lib/curation/patch-route';
import { POST as search } from '../../src/pages/api/search/index';
import type { Role } from '../../src/lib/roles';

const sequelize = useTestDatabase();
const PASSWORD = 'follow-the-library-1';
const tag = crypto.randomBytes(3).toString('hex');
const users: Record<string, { id: string; email: string; name: string; roles: Role[] }> = {};

// Invented spectrum of an invented-mass pattern, so no other test's record competes.
const peaks: [number, number][] = [[61, 20], [89, 35], [117, 100], [145, 60], [173, 12], [201, 44], [202, 6], [229, 3]];
const jcamp = [
  `##TITLE=Index-follow probe ${tag}`, '##JCAMP-DX=5.01', '##DATA TYPE=MASS SPECTRUM', '##DATA CLASS=PEAK TABLE',
  '##MOLFORM=C 12 H 23 N O', '##.IONIZATION MODE=EI+', '##.IONIZATION ENERGY=70', `##NPOINTS=${peaks.length}`, '##PEAK TABLE=(XY..XY)',
  ...peaks.map(([x, y]) => `${x},${y}`), '##END=',
].join('\n');

async function makeUser(key: string, roles: Role[]) {
  const id = crypto.randomUUID();
  const now = new Date();
  const m = getModels(sequelize);
  const email = `${key}-${tag}@example.test`;
  await m.User.create({ id, name: `Follow ${key}`, email, emailVerified: true, roles: roles.join(','), active: true, createdAt: now, updatedAt: now });
  await sequelize.query('INSERT INTO account (id, accountId, providerId, userId, password, createdAt, updatedAt) VALUES (?,?,?,?,?,?,?)', {
    replacements: [crypto.randomUUID(), id, 'credential', id, await hashPassword(PASSWORD), now, now],
  });
  users[key] = { id, email, name: `Follow ${key}`, roles };
}

async function as(key: string, fn: any, opts: any) {
  const u = users[key];
  const request = new Request(opts.url ?? 'http://127.0.0.1/api/x', {
    method: opts.method ?? 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(opts.body),
  });
  const res = await fn({ request, url: new URL(request.url), params: opts.params ?? {}, locals: { user: u, session: null, apiKeyId: null } });
  return { status: res.status, json: await res.json() };
}

async function topHit() {
  const r = await callRoute(search, { method: 'POST', body: { peaks, limit: 3 }, roles: ['analyst'] });
  expect(r.status).toBe(200);
  return r.json.hits[0];
}

let recordId = 0;

beforeAll(async () => {
  await makeUser('curA', ['curator']);
  await makeUser('curB', ['curator']);
  await rebuildLibraryIndex();
  const r = await importFile({ fileName: `probe-${tag}.jdx`, text: jcamp, actor: users.curA });
  expect(r.report.status).toBe('imported');
  recordId = r.report.spectra[0].id;
});

afterAll(async () => {
  stopLibraryIndexPolling();
  await closeSequelize();
});

describe('the search index follows the library', () => {
  it('a draft is not found by an analyst search', async () => {
    const hit = await topHit();
    expect(hit?.spectrumId).not.toBe(recordId);
  });

  it('a release through the API makes it the top hit of its own spectrum within a second', async () => {
    expect((await as('curA', review, { body: { action: 'submit' }, params: { id: String(recordId) } })).status).toBe(200);
    const t0 = Date.now();
    const ok = await as('curB', review, { body: { action: 'approve', password: PASSWORD }, params: { id: String(recordId) } });
    expect(ok.status).toBe(200);
    let hit = await topHit();
    while (hit?.spectrumId !== recordId && Date.now() - t0 < 1000) {
      await new Promise((r) => setTimeout(r, 50));
      hit = await topHit();
    }
    expect(Date.now() - t0).toBeLessThan(1000);
    expect(hit.spectrumId).toBe(recordId);
    expect(hit.version).toBe(1);
    expect(hit.scores.cosine).toBeCloseTo(1, 6);
    expect(hit.score).toBeCloseTo(1, 6); // float32 weights in the index
  });

  it('its new released version replaces it', async () => {
    const e = await as('curA', patch, { method: 'PATCH', body: { notes: `edited ${tag}`, reason: 'add a note' }, params: { id: String(recordId) } });
    expect(e.status).toBe(200);
    // version 1 stays released and searchable until version 2 is approved
    expect((await topHit()).version).toBe(1);
    expect((await as('curA', review, { body: { action: 'submit' }, params: { id: String(recordId) } })).status).toBe(200);
    expect((await as('curB', review, { body: { action: 'approve', password: PASSWORD }, params: { id: String(recordId) } })).status).toBe(200);
    const hit = await topHit();
    expect(hit.spectrumId).toBe(recordId);
    expect(hit.version).toBe(2);
    // one entry for the record: version 1 left the index when version 2 was released
    const probe = (getLibraryIndex() as any).search(peaks, { limit: 5 }, {}).hits.filter((h: any) => h.recordId === recordId);
    expect(probe.map((h: any) => h.version)).toEqual([2]);
  });

  it('retired, it is gone from the hits', async () => {
    const r = await as('curA', review, { body: { action: 'retire', reason: 'probe done' }, params: { id: String(recordId) } });
    expect(r.status).toBe(200);
    const hit = await topHit();
    expect(hit?.spectrumId).not.toBe(recordId);
  });
});
