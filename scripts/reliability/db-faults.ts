// Database fault run: SIGKILL the private mariadbd in the middle of a 200-file
// import, then check that
//   - every file is either fully imported or absent (no partial record),
//   - while the database is down the app stays up, /api/health answers 503
//     with db "down", and routes that need the database answer 503 with a message,
//   - after mariadbd is started again (same DATA_DIR and port) the app
//     reconnects by itself within 10 s, without a restart,
//   - uploading the same batch again imports exactly the missing files and
//     reports the rest as duplicates,
//   - `npm run check-data` passes.
//
//   node --import tsx scripts/reliability/db-faults.ts    (FAULT_FILES=200, KEEP_DATA=1)
import fs from 'node:fs';
import { startPrivateMariadb } from '../../db/mariadb.mjs';
import { startServer, makeDataDir, snapshotRoot, removeSnapshot, sleep, mariadbPid, pidAlive, waitForExit, waitForHealth, getHealth, type ServerHandle } from './lib/server';
import { call, signInOrThrow, demoEmail, uploadFiles, statusByFile, type Credential } from './lib/client';
import { runFile, syntheticPeaks } from './lib/jcamp';
import { RunReport, runCheckData, sqlConnection, round } from './lib/report';

const FILES = Number(process.env.FAULT_FILES ?? 200);
const RUN = 'dbfault';
const RECONNECT_LIMIT_MS = 10_000;

async function storedByFile(dbPort: number): Promise<Map<string, { records: number; versions: number; peakCount: number; audited: number }>> {
  const c = await sqlConnection(dbPort);
  try {
    const rows = await c.query(
      `SELECT v.sourceFileName AS file, COUNT(DISTINCT v.recordId) AS records, COUNT(*) AS versions, MIN(v.peakCount) AS peakCount,
              (SELECT COUNT(*) FROM audit_event a WHERE a.recordId = MIN(v.recordId)) AS audited
         FROM spectrum_version v WHERE v.sourceFileName LIKE ? GROUP BY v.sourceFileName`,
      [`${RUN}-%`],
    );
    return new Map(rows.map((r: any) => [String(r.file), { records: Number(r.records), versions: Number(r.versions), peakCount: Number(r.peakCount), audited: Number(r.audited) }]));
  } finally {
    await c.end();
  }
}

async function countStored(dbPort: number): Promise<number> {
  const c = await sqlConnection(dbPort);
  try {
    const [r] = await c.query('SELECT COUNT(*) AS n FROM spectrum_version WHERE sourceFileName LIKE ?', [`${RUN}-%`]);
    return Number(r.n);
  } finally {
    await c.end();
  }
}

export async function runDbFaults(): Promise<number> {
  const rep = new RunReport('db-faults');
  const root = snapshotRoot((s) => rep.log(s));
  const dataDir = makeDataDir('dbfaults');
  let server: ServerHandle | null = null;
  let restarted: { stop: () => Promise<void> } | null = null;
  try {
    server = await startServer({ dataDir, root });
    const { base, dbPort } = server;
    rep.log(`server ${base}, DATA_DIR ${dataDir}`);
    const curator: Credential = { cookie: await signInOrThrow(base, demoEmail('curator')) };
    const files = Array.from({ length: FILES }, (_, i) => runFile(RUN, i + 1, 3));
    const peakCounts = new Map(files.map((f, i) => [f.name, syntheticPeaks(300_000 + i + 1).length]));

    // --- import, and kill mariadbd once about a third of the files are in
    const t0 = Date.now();
    const upload = uploadFiles(base, curator, files);
    let atKill = 0;
    for (let i = 0; i < 1200; i++) {
      await sleep(100);
      atKill = await countStored(dbPort).catch(() => atKill);
      if (atKill >= Math.floor(FILES / 3)) break;
    }
    const pid = mariadbPid(dataDir);
    if (!pid || !pidAlive(pid)) throw new Error('no running mariadbd found in DATA_DIR/mariadb/mysqld.pid');
    process.kill(pid, 'SIGKILL');
    await waitForExit(pid, 10_000);
    const killedAt = Date.now();
    rep.log(`SIGKILL mariadbd (pid ${pid}) ${round((killedAt - t0) / 1000)} s into the import, ${atKill} of ${FILES} files stored`);
    rep.figure('filesStoredWhenKilled', atKill);

    const first = await upload.catch((e) => ({ status: 0, body: { error: String(e) } }) as any);
    rep.figure('importAnswerWhileKilled', { status: first.status, code: first.body?.error?.code ?? null, ms: Date.now() - t0 });
    rep.check('the interrupted import answers 503 with a message', first.status === 503 && typeof first.body?.error?.message === 'string', `HTTP ${first.status} ${JSON.stringify(first.body?.error ?? {}).slice(0, 160)}`);

    // --- while the database is down
    const h = await getHealth(base);
    rep.check('/api/health answers 503 with db "down"', h?.status === 503 && h.body.db === 'down', `HTTP ${h?.status} ${JSON.stringify(h?.body ?? null).slice(0, 160)}`);
    const probes = [
      await call(base, '/api/spectra?pageSize=5', curator),
      await call(base, '/api/spectra/1', curator),
      await call(base, '/api/search', { ...curator, json: { peaks: [[43, 999], [57, 500]] } }),
      await call(base, '/api/admin/users', curator),
      await call(base, '/api/imports', { ...curator, body: new FormData() }),
    ];
    const down = probes.map((p) => `${p.status}${p.body?.error?.code ? ` ${p.body.error.code}` : ''}`);
    rep.check('database routes answer 503 with a message while it is down', probes.every((p) => p.status === 503 && typeof p.body?.error?.message === 'string' && p.body.error.message.length > 0), down.join(', '));
    const page = await call(base, '/library', curator);
    rep.check('pages answer 503 while the database is down', page.status === 503, `HTTP ${page.status}`);
    rep.check('the app process stays up', server.child.exitCode === null && server.child.signalCode === null);
    rep.figure('answersWhileDown', { health: h?.status, routes: down, page: page.status });

    // --- bring mariadbd back on the same DATA_DIR and port
    const tRestart = Date.now();
    const db = await startPrivateMariadb({ dataDir, port: dbPort });
    restarted = db;
    const dbBackMs = Date.now() - tRestart;
    const tBack = Date.now();
    const healthy = await waitForHealth(base, (x) => x?.status === 200 && x.body.db === 'up' && x.body.status === 'ok', 30_000, 100);
    const reconnectMs = Date.now() - tBack;
    const again = await call(base, '/api/spectra?pageSize=5', curator);
    rep.figure('mariadbRestartMs', dbBackMs);
    rep.figure('appReconnectMs', reconnectMs);
    rep.check(`the app reconnects by itself within ${RECONNECT_LIMIT_MS / 1000} s`, healthy.ok && reconnectMs <= RECONNECT_LIMIT_MS && again.status === 200, `health ok after ${reconnectMs} ms; GET /api/spectra → ${again.status}; session kept`);

    // --- every file fully imported or absent
    const stored = await storedByFile(dbPort);
    const partial = [...stored.entries()].filter(([f, s]) => s.records !== 1 || s.versions !== 1 || s.peakCount !== peakCounts.get(f) || s.audited < 1);
    rep.figure('filesStoredAfterCrash', stored.size);
    rep.check('every file is fully imported or absent', partial.length === 0 && stored.size < FILES && stored.size >= atKill, `${stored.size} complete, ${FILES - stored.size} absent, ${partial.length} partial${partial[0] ? ` (${partial[0][0]}: ${JSON.stringify(partial[0][1])})` : ''}`);
    const cd1 = runCheckData({ DATA_DIR: dataDir, DB_PORT: String(dbPort) });
    rep.check('check-data passes after the crash', cd1.ok, cd1.output.split('\n').slice(-3).join(' '));

    // --- the same batch again: exactly the missing files are imported
    const t2 = Date.now();
    const second = await uploadFiles(base, curator, files);
    const st = statusByFile(second.body);
    const missing = files.filter((f) => !stored.has(f.name)).map((f) => f.name);
    const importedAgain = files.filter((f) => st.get(f.name) === 'imported').map((f) => f.name);
    const duplicates = files.filter((f) => st.get(f.name) === 'duplicate').length;
    const wrong = files.filter((f) => (stored.has(f.name) ? st.get(f.name) !== 'duplicate' : st.get(f.name) !== 'imported'));
    rep.figure('reupload', { status: second.status, imported: importedAgain.length, duplicate: duplicates, ms: Date.now() - t2 });
    rep.check(
      're-uploading imports exactly the missing files, the rest are duplicates',
      second.status === 200 && wrong.length === 0 && importedAgain.length === missing.length && duplicates === FILES - missing.length,
      `${importedAgain.length} imported (missing: ${missing.length}), ${duplicates} duplicate${wrong[0] ? `; ${wrong[0].name} is ${st.get(wrong[0].name)}` : ''}`,
    );
    const final = await storedByFile(dbPort);
    const complete = [...final.entries()].filter(([f, s]) => s.records === 1 && s.versions === 1 && s.peakCount === peakCounts.get(f)).length;
    rep.check('all files stored exactly once', final.size === FILES && complete === FILES, `${final.size} files, ${complete} complete`);
    const cd2 = runCheckData({ DATA_DIR: dataDir, DB_PORT: String(dbPort) });
    rep.check('check-data passes at the end', cd2.ok, cd2.output.split('\n').slice(-3).join(' '));
    rep.figure('checkData', cd2.output.split('\n')[0]);
  } catch (e) {
    rep.check('db-faults run completed', false, (e as Error).stack ?? String(e));
    if (server) console.log(server.logTail(2000));
  } finally {
    await server?.stop();
    await restarted?.stop();
    if (!process.env.KEEP_DATA) fs.rmSync(dataDir, { recursive: true, force: true });
    removeSnapshot(root);
  }
  return rep.finish();
}

if (import.meta.url === `file://${process.argv[1]}`) process.exit(await runDbFaults());
