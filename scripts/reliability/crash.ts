// App crash run: SIGKILL the app process (scripts/start.ts, what `npm start`
// runs) in the middle of a 200-file import, start it again on the same
// DATA_DIR, then SIGKILL it while a curator approves 40 records at once, and
// start it again. After each restart `npm run check-data` must pass (no
// partial record, no orphan version, no audit gap), every file must be fully
// imported or absent, and every approval fully made (released + signature +
// audit event) or not at all (still in review, none of them).
//
//   node --import tsx scripts/reliability/crash.ts    (CRASH_FILES=200, KEEP_DATA=1)
import fs from 'node:fs';
import { startServer, makeDataDir, snapshotRoot, removeSnapshot, sleep, type ServerHandle } from './lib/server';
import { call, signInOrThrow, demoEmail, uploadFiles, statusByFile, type Credential } from './lib/client';
import { runFile } from './lib/jcamp';
import { RunReport, runCheckData, sqlConnection, countReleased, round } from './lib/report';

const FILES = Number(process.env.CRASH_FILES ?? 200);
const APPROVALS = 40;
const RUN = 'crash';

async function sql<T = any>(dbPort: number, q: string, params: unknown[] = []): Promise<T[]> {
  const c = await sqlConnection(dbPort);
  try {
    return await c.query(q, params);
  } finally {
    await c.end();
  }
}

export async function runCrash(): Promise<number> {
  const rep = new RunReport('crash');
  const root = snapshotRoot((s) => rep.log(s));
  const dataDir = makeDataDir('crash');
  let server: ServerHandle | null = null;
  try {
    server = await startServer({ dataDir, root });
    const ports = { port: server.port, dbPort: server.dbPort, mailPort: server.mailPort };
    const { dbPort } = ports;
    rep.log(`server ${server.base}, DATA_DIR ${dataDir}`);
    let curator: Credential = { cookie: await signInOrThrow(server.base, demoEmail('curator')) };
    const files = Array.from({ length: FILES }, (_, i) => runFile(RUN, i + 1, 5));

    // --- 1. crash during an import
    const upload = uploadFiles(server.base, curator, files).catch((e) => ({ status: 0, error: String(e) }));
    let atKill = 0;
    for (let i = 0; i < 1200 && atKill < Math.floor(FILES / 3); i++) {
      await sleep(100);
      const [r] = await sql(dbPort, 'SELECT COUNT(*) AS n FROM spectrum_version WHERE sourceFileName LIKE ?', [`${RUN}-%`]);
      atKill = Number(r.n);
    }
    await server.kill();
    const answer: any = await upload;
    rep.log(`SIGKILL the app during the import (${atKill} of ${FILES} files stored); the client saw ${answer.status === 0 ? 'the connection drop' : `HTTP ${answer.status}`}`);
    rep.figure('filesStoredWhenAppKilled', atKill);

    let t = Date.now();
    server = await startServer({ dataDir, root, ...ports });
    rep.figure('restartAfterImportCrashMs', Date.now() - t);
    rep.log(`started again in ${round((Date.now() - t) / 1000)} s`);
    const cd1 = runCheckData({ DATA_DIR: dataDir, DB_PORT: String(dbPort) });
    rep.check('check-data passes after the crash during an import', cd1.ok, cd1.output.split('\n').slice(-2).join(' '));
    const stored = await sql(dbPort, 'SELECT sourceFileName AS f, COUNT(*) AS n, MIN(peakCount) AS pc FROM spectrum_version WHERE sourceFileName LIKE ? GROUP BY sourceFileName', [`${RUN}-%`]);
    const storedSet = new Set(stored.map((r: any) => String(r.f)));
    rep.check('every file is fully imported or absent', stored.every((r: any) => Number(r.n) === 1 && Number(r.pc) > 0) && storedSet.size >= atKill, `${storedSet.size} stored, ${FILES - storedSet.size} absent`);
    curator = { cookie: await signInOrThrow(server.base, demoEmail('curator')) };
    const again = await uploadFiles(server.base, curator, files);
    const st = statusByFile(again.body);
    const wrong = files.filter((f) => (storedSet.has(f.name) ? st.get(f.name) !== 'duplicate' : st.get(f.name) !== 'imported'));
    rep.check('uploading the batch again imports exactly the missing files', again.status === 200 && wrong.length === 0, `${[...st.values()].filter((s) => s === 'imported').length} imported, ${[...st.values()].filter((s) => s === 'duplicate').length} duplicate`);

    // --- 2. crash during approvals
    const curator2: Credential = { cookie: await signInOrThrow(server.base, demoEmail('curator2')) };
    const drafts: number[] = (again.body.files as any[]).filter((f) => f.status === 'imported').flatMap((f) => f.spectra.map((s: any) => s.id)).slice(0, APPROVALS);
    for (const id of drafts) {
      const s = await call(server.base, `/api/spectra/${id}/review`, { ...curator, json: { action: 'submit' } });
      if (s.status !== 200) throw new Error(`submit ${id}: HTTP ${s.status}`);
    }
    const releasedBefore = await countReleased(dbPort);
    const [sigRow] = await sql(dbPort, "SELECT COUNT(*) AS n FROM signature WHERE subjectType = 'spectrum_version'");
    const sigsBefore = Number(sigRow.n);
    const approvals = drafts.map((id) => call(server!.base, `/api/spectra/${id}/review`, { ...curator2, json: { action: 'approve', password: 'ionotheca-demo' } }).catch(() => null));
    let signed = 0;
    for (let i = 0; i < 600; i++) {
      await sleep(20);
      const [r] = await sql(dbPort, "SELECT COUNT(*) AS n FROM signature WHERE subjectType = 'spectrum_version'");
      signed = Number(r.n) - sigsBefore;
      if (signed >= 5) break;
    }
    await server.kill();
    const answers = await Promise.all(approvals);
    const okAnswers = answers.filter((a) => a?.status === 200).length;
    rep.log(`SIGKILL the app during ${APPROVALS} concurrent approvals (${signed} signatures committed when killed, ${okAnswers} answered 200)`);
    rep.figure('approvalsWhenAppKilled', { inFlight: APPROVALS, committedAtKill: signed, answered200: okAnswers });

    t = Date.now();
    server = await startServer({ dataDir, root, ...ports });
    rep.figure('restartAfterApprovalCrashMs', Date.now() - t);
    const cd2 = runCheckData({ DATA_DIR: dataDir, DB_PORT: String(dbPort) });
    rep.check('check-data passes after the crash during approvals', cd2.ok, cd2.output.split('\n').slice(-2).join(' '));
    const rows = await sql(
      dbPort,
      `SELECT v.recordId, v.status, v.approvedAt,
              (SELECT COUNT(*) FROM signature s WHERE s.subjectType = 'spectrum_version' AND s.subjectId = v.id) AS sigs,
              (SELECT COUNT(*) FROM audit_event a WHERE a.recordId = v.recordId AND a.version = v.version AND a.action = 'spectrum.approve') AS audits
         FROM spectrum_version v WHERE v.recordId IN (?)`,
      [drafts],
    );
    const whole = rows.filter((r: any) => (r.status === 'released' && r.approvedAt && Number(r.sigs) === 1 && Number(r.audits) === 1) || (r.status === 'in_review' && !r.approvedAt && Number(r.sigs) === 0 && Number(r.audits) === 0));
    const releasedNow = rows.filter((r: any) => r.status === 'released').length;
    rep.figure('approvalsAfterRestart', { released: releasedNow, stillInReview: rows.length - releasedNow });
    rep.check('every approval was made whole or not at all', rows.length === drafts.length && whole.length === rows.length && releasedNow >= okAnswers, `${releasedNow} released with signature and audit event, ${rows.length - releasedNow} still in review, ${rows.length - whole.length} inconsistent`);
    const h = await call(server.base, '/api/health');
    const sqlReleased = await countReleased(dbPort);
    rep.check('the index after restart holds every released spectrum', h.body.library?.spectra === sqlReleased && sqlReleased === releasedBefore + releasedNow, `index ${h.body.library?.spectra}, SQL ${sqlReleased}`);
    // the ones left in review can still be approved after the restart
    const c2: Credential = { cookie: await signInOrThrow(server.base, demoEmail('curator2')) };
    const left = rows.filter((r: any) => r.status === 'in_review').map((r: any) => Number(r.recordId));
    let finished = 0;
    for (const id of left) if ((await call(server.base, `/api/spectra/${id}/review`, { ...c2, json: { action: 'approve', password: 'ionotheca-demo' } })).status === 200) finished++;
    rep.check('the approvals left undone can be made after the restart', finished === left.length, `${finished} of ${left.length}`);
    const cd3 = runCheckData({ DATA_DIR: dataDir, DB_PORT: String(dbPort) });
    rep.check('check-data passes at the end', cd3.ok, cd3.output.split('\n').slice(-2).join(' '));
    rep.figure('checkData', cd3.output.split('\n')[0]);
  } catch (e) {
    rep.check('crash run completed', false, (e as Error).stack ?? String(e));
    if (server) console.log(server.logTail(2000));
  } finally {
    await server?.stop();
    if (!process.env.KEEP_DATA) fs.rmSync(dataDir, { recursive: true, force: true });
    removeSnapshot(root);
  }
  return rep.finish();
}

if (import.meta.url === `file://${process.argv[1]}`) process.exit(await runCrash());
