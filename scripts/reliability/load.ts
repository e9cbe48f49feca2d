// Load run: 50 analysts, each signed in with a session of their own (as the
// web pages are), search with autocannon for 60 s while 3 curators import and
// release files and one admin edits users, against a server this script
// starts on loopback with its own ports and DATA_DIR; then 20 s more of search
// with each connection on an API key of its own. All request loops are
// bounded in time and count and stop by themselves.
//
// Figures: search requests/s, search p50/p95/p99, errors of every kind, and
// the index size (GET /api/health library.spectra) against the count of
// released versions in SQL at the end. Targets: 0 errors, search p95 < 500 ms.
//
//   node --import tsx scripts/reliability/load.ts
//   env: LOAD_SECONDS (60), LOAD_CONNECTIONS (50), LOAD_API_KEY_SHARE (0: share of
//   the main phase on API keys), LOAD_KEY_SECONDS (20; 0 skips), KEEP_DATA=1 keeps DATA_DIR
import fs from 'node:fs';
import autocannon, { type Result } from 'autocannon';
import { startServer, makeDataDir, snapshotRoot, removeSnapshot, sleep, type ServerHandle } from './lib/server';
import { call, signInOrThrow, demoEmail, userId, issueApiKey, uploadFiles, percentile, type Credential } from './lib/client';
import { runFile, rng } from './lib/jcamp';
import { RunReport, countReleased, runCheckData, round } from './lib/report';

const SECONDS = Number(process.env.LOAD_SECONDS ?? 60);
const CONNECTIONS = Number(process.env.LOAD_CONNECTIONS ?? 50);
const P95_TARGET_MS = 500;
/** Share of the analysts of the main phase that come through API keys; the rest sign in (as the web pages do). */
const KEY_SHARE = Number(process.env.LOAD_API_KEY_SHARE ?? 0);
/** A second, search-only phase with every connection on its own API key (instruments, scripts); 0 skips it. */
const KEY_SECONDS = Number(process.env.LOAD_KEY_SECONDS ?? 20);

interface SearchLoad {
  result: Result;
  latencies: number[];
  statuses: Record<string, number>;
}

/** autocannon on POST /api/search: one credential per connection, a random body per request. */
async function searchLoad(base: string, creds: Record<string, string>[], seconds: number, bodies: string[], alongside: Promise<unknown>[] = []): Promise<SearchLoad> {
  const latencies: number[] = [];
  const statuses: Record<string, number> = {};
  let next = 0;
  const pick = () => bodies[Math.floor(Math.random() * bodies.length)];
  const cannon = autocannon({
    url: `${base}/api/search`,
    connections: creds.length,
    duration: seconds,
    timeout: 30,
    setupClient: (client: any) => {
      const headers = { 'content-type': 'application/json', ...creds[(next++ * 7) % creds.length] };
      client.setRequests([{ method: 'POST', path: '/api/search', headers, setupRequest: (req: any) => ({ ...req, headers, body: pick() }) }]);
    },
  });
  cannon.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
    latencies.push(responseTime);
    statuses[statusCode] = (statuses[statusCode] ?? 0) + 1;
  });
  const [result] = await Promise.all([cannon as unknown as Promise<Result>, ...alongside]);
  latencies.sort((a, b) => a - b);
  return { result, latencies, statuses };
}

export async function runLoad(): Promise<number> {
  const rep = new RunReport('load');
  const root = snapshotRoot((s) => rep.log(s));
  const dataDir = makeDataDir('load');
  let server: ServerHandle | null = null;
  try {
    server = await startServer({ dataDir, root });
    const base = server.base;
    rep.log(`server ${base}, DATA_DIR ${dataDir}`);

    // --- who: an admin, three curators (the admin makes viewer@ a curator too), 50 analysts
    const admin: Credential = { cookie: await signInOrThrow(base, demoEmail('admin')) };
    const viewerId = await userId(base, admin, demoEmail('viewer'));
    const auditorId = await userId(base, admin, demoEmail('auditor'));
    const analystId = await userId(base, admin, demoEmail('analyst'));
    const promote = await call(base, `/api/admin/users/${viewerId}`, { ...admin, method: 'PATCH', json: { roles: ['viewer', 'curator'] } });
    if (promote.status !== 200) throw new Error(`promoting viewer@ to curator: HTTP ${promote.status}`);
    const curators: Credential[] = [];
    for (const who of ['curator', 'curator2', 'viewer']) curators.push({ cookie: await signInOrThrow(base, demoEmail(who)) });

    // 54 sign-ins in all (admin, 3 curators, 50 analysts): under the sign-in
    // limit of 60 a minute from one address (src/lib/auth.ts), so more
    // connections than that come through API keys (LOAD_API_KEY_SHARE).
    const analysts: Record<string, string>[] = [];
    const keyCount = Math.round(CONNECTIONS * KEY_SHARE);
    for (let i = 0; i < CONNECTIONS; i++) {
      if (i < keyCount) analysts.push({ authorization: `Bearer ${await issueApiKey(base, admin, analystId, `load analyst ${i}`)}` });
      else analysts.push({ cookie: await signInOrThrow(base, demoEmail('analyst')), origin: base });
    }
    rep.log(`${analysts.length} analyst credentials (${keyCount} API keys, ${CONNECTIONS - keyCount} sessions)`);
    rep.figure('analysts', { apiKeys: keyCount, sessions: CONNECTIONS - keyCount });

    // --- what: queries made from released demo spectra, with noise, some with filters
    const list = await call(base, '/api/spectra?pageSize=200', { cookie: curators[0].cookie });
    const ids: number[] = list.body.items.map((x: any) => x.id);
    const r = rng(42);
    const bodies: string[] = [];
    for (const id of ids.slice(0, 120)) {
      const rec = await call(base, `/api/spectra/${id}`, { cookie: curators[0].cookie });
      const peaks = (rec.body.peaks as [number, number][])
        .filter(() => r() > 0.05)
        .map(([mz, y]) => [mz, Math.max(1, Math.round(y * (0.85 + 0.3 * r())))] as [number, number]);
      if (peaks.length === 0) continue;
      const body: any = { peaks, limit: 20 };
      const k = r();
      if (k < 0.1 && rec.body.nominalMass) body.filters = { massMin: Math.max(0, rec.body.nominalMass - 20), massMax: rec.body.nominalMass + 20 };
      else if (k < 0.2) body.filters = { excludeElements: ['Br'] };
      else if (k < 0.25) body.options = { rankBy: 'entropy' };
      bodies.push(JSON.stringify(body));
    }
    rep.log(`${bodies.length} distinct search bodies`);
    const releasedBefore = await countReleased(server.dbPort);

    // --- the background writers, bounded by the same deadline and an iteration cap
    const deadline = Date.now() + SECONDS * 1000;
    const writerErrors: string[] = [];
    let imported = 0;
    let released = 0;
    let importCalls = 0;
    const importMs: number[] = [];
    let adminEdits = 0;
    const adminMs: number[] = [];

    const curatorLoop = async (c: number) => {
      for (let iter = 0; iter < 200 && Date.now() < deadline; iter++) {
        const files = Array.from({ length: 4 }, (_, j) => runFile(`load-c${c}`, iter * 4 + j, 7 + c));
        const up = await uploadFiles(base, curators[c], files);
        importCalls++;
        importMs.push(up.ms);
        if (up.status !== 200) {
          writerErrors.push(`import by curator ${c}: HTTP ${up.status} ${JSON.stringify(up.body).slice(0, 200)}`);
          continue;
        }
        const drafts = (up.body.files as any[]).filter((f) => f.status === 'imported').flatMap((f) => f.spectra.map((s: any) => s.id));
        imported += drafts.length;
        if (drafts.length !== files.length) writerErrors.push(`curator ${c}: ${drafts.length} of ${files.length} files imported`);
        // release half of them: submitted by this curator, approved by the next one
        for (const id of drafts.slice(0, 2)) {
          const s = await call(base, `/api/spectra/${id}/review`, { ...curators[c], json: { action: 'submit' } });
          const a = s.status === 200 ? await call(base, `/api/spectra/${id}/review`, { ...curators[(c + 1) % 3], json: { action: 'approve', password: 'ionotheca-demo' } }) : s;
          if (a.status === 200) released++;
          else writerErrors.push(`release of ${id}: HTTP ${a.status} ${JSON.stringify(a.body).slice(0, 200)}`);
        }
      }
    };
    const adminLoop = async () => {
      for (let iter = 0; iter < 2000 && Date.now() < deadline; iter++) {
        const roles = iter % 2 === 0 ? ['auditor', 'viewer'] : ['auditor'];
        const p = await call(base, `/api/admin/users/${auditorId}`, { ...admin, method: 'PATCH', json: { roles } });
        const l = await call(base, '/api/admin/users', admin);
        adminMs.push(p.ms, l.ms);
        if (p.status !== 200 || l.status !== 200) writerErrors.push(`admin edit: HTTP ${p.status}/${l.status}`);
        else adminEdits++;
        await sleep(250);
      }
    };

    // --- the searchers
    rep.log(`searching with ${CONNECTIONS} connections for ${SECONDS} s while 3 curators import and an admin edits users…`);
    const { result, latencies, statuses } = await searchLoad(base, analysts, SECONDS, bodies, [curatorLoop(0), curatorLoop(1), curatorLoop(2), adminLoop()]);

    // --- figures
    const searchErrors = result.errors + result.timeouts + result.non2xx;
    const p50 = percentile(latencies, 50);
    const p95 = percentile(latencies, 95);
    const p99 = percentile(latencies, 99);
    rep.figure('searchRequests', result.requests.total);
    rep.figure('searchRequestsPerSecond', round(result.requests.total / SECONDS));
    rep.figure('searchLatencyMs', { p50: round(p50), p95: round(p95), p99: round(p99), max: round(latencies.at(-1) ?? NaN) });
    rep.figure('searchStatusCodes', statuses);
    rep.figure('searchErrors', { errors: result.errors, timeouts: result.timeouts, non2xx: result.non2xx });
    importMs.sort((a, b) => a - b);
    adminMs.sort((a, b) => a - b);
    rep.figure('imports', { calls: importCalls, filesImported: imported, released, p50Ms: round(percentile(importMs, 50)), p95Ms: round(percentile(importMs, 95)) });
    rep.figure('adminEdits', { edits: adminEdits, p95Ms: round(percentile(adminMs, 95)) });
    rep.figure('writerErrors', writerErrors.slice(0, 10));
    rep.figure('connections', CONNECTIONS);
    rep.figure('seconds', SECONDS);

    rep.check('searches answered without errors', searchErrors === 0 && result.requests.total > 0, `${result.requests.total} searches, ${searchErrors} errors`);
    rep.check(`search p95 under ${P95_TARGET_MS} ms`, p95 < P95_TARGET_MS, `p50 ${round(p50)} ms, p95 ${round(p95)} ms, p99 ${round(p99)} ms`);
    rep.check('curators and admin worked without errors', writerErrors.length === 0 && imported > 0 && adminEdits > 0, `${imported} files imported, ${released} released, ${adminEdits} user edits, ${writerErrors.length} errors${writerErrors[0] ? `: ${writerErrors[0]}` : ''}`);

    // the index follows the library: released versions in SQL == spectra in the index
    await sleep(2500);
    const sqlReleased = await countReleased(server.dbPort);
    const h = await call(base, '/api/health');
    rep.figure('releasedSpectra', { before: releasedBefore, after: sqlReleased, index: h.body.library?.spectra });
    rep.check('index size equals released spectra in SQL', h.body.library?.spectra === sqlReleased && sqlReleased === releasedBefore + released, `index ${h.body.library?.spectra}, SQL ${sqlReleased} (${releasedBefore} + ${released} released during the run)`);

    const cd = runCheckData({ DATA_DIR: dataDir, DB_PORT: String(server.dbPort) });
    rep.check('check-data passes after the load', cd.ok, cd.output.split('\n').slice(-2).join(' '));

    // --- the same searches with every connection on an API key (search only)
    if (KEY_SECONDS > 0) {
      const keys: Record<string, string>[] = [];
      for (let i = 0; i < CONNECTIONS; i++) keys.push({ authorization: `Bearer ${await issueApiKey(base, admin, analystId, `load key ${i}`)}` });
      rep.log(`searching with ${CONNECTIONS} API keys for ${KEY_SECONDS} s (search only)…`);
      const k = await searchLoad(base, keys, KEY_SECONDS, bodies);
      const kErrors = k.result.errors + k.result.timeouts + k.result.non2xx;
      const kp = { p50: round(percentile(k.latencies, 50)), p95: round(percentile(k.latencies, 95)), p99: round(percentile(k.latencies, 99)) };
      rep.figure('apiKeyPhase', { seconds: KEY_SECONDS, requests: k.result.requests.total, requestsPerSecond: round(k.result.requests.total / KEY_SECONDS), latencyMs: kp, errors: kErrors });
      rep.check('searches through API keys answered without errors', kErrors === 0 && k.result.requests.total > 0, `${k.result.requests.total} searches, ${round(k.result.requests.total / KEY_SECONDS)}/s, p50 ${kp.p50} ms, p95 ${kp.p95} ms (figure only: each key use writes lastRequest)`);
    }
  } catch (e) {
    rep.check('load run completed', false, (e as Error).stack ?? String(e));
    if (server) console.log(server.logTail(2000));
  } finally {
    await server?.stop();
    if (!process.env.KEEP_DATA) fs.rmSync(dataDir, { recursive: true, force: true });
    removeSnapshot(root);
  }
  return rep.finish();
}

if (import.meta.url === `file://${process.argv[1]}`) process.exit(await runLoad());
