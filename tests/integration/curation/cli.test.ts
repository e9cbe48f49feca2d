// `npm run import -- FILES…` against the test database: folders and globs,
// the summary table, exit status 1 when a file was rejected, the "cli" actor.
import { describe, it, expect, afterAll } from 'vitest';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { inject } from 'vitest';
import { QueryTypes } from 'sequelize';
import { useTestDatabase } from '../../helpers/db';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import { RUN, peakTableFile, rng, randomPeaks } from './helpers';

const sequelize = useTestDatabase();
afterAll(() => closeSequelize());

function runCli(args: string[]) {
  return spawnSync(process.execPath, ['--import', 'tsx', 'scripts/import.ts', ...args], {
    env: { ...process.env, DATABASE_URL: inject('dbUrl') }, encoding: 'utf8', timeout: 120_000,
  });
}

describe('npm run import', () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ionotheca-cli-'));
  const next = rng(31337);
  fs.mkdirSync(path.join(dir, 'sub'));
  fs.writeFileSync(path.join(dir, 'a.jdx'), peakTableFile({ title: `Cli A ${RUN}`, formula: 'C5H12', peaks: randomPeaks(next) }));
  fs.writeFileSync(path.join(dir, 'sub', 'b.JDX'), peakTableFile({ title: `Cli B ${RUN}`, formula: 'C6H14', peaks: randomPeaks(next) }));
  fs.writeFileSync(path.join(dir, 'notes.txt'), 'not picked up from a folder');
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it('imports a folder recursively as the cli user and exits 0', async () => {
    const r = runCli([dir]);
    expect(r.stderr + r.stdout).toMatch(/\[#+\] 2\/2/);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/file\s+status\s+records\s+detail/);
    expect(r.stdout).toMatch(/2 imported/);
    const rows = await sequelize.query<any>("SELECT r.createdBy, b.source FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId JOIN import_batch b ON b.id = v.importBatchId WHERE v.name IN (?)", {
      replacements: [[`Cli A ${RUN}`, `Cli B ${RUN}`]], type: QueryTypes.SELECT,
    });
    expect(rows).toEqual([{ createdBy: null, source: 'cli' }, { createdBy: null, source: 'cli' }]);
    const ev = await sequelize.query<any>("SELECT e.actorId, e.actorEmail FROM audit_event e JOIN spectrum_version v ON v.recordId = e.recordId WHERE v.name = ? AND e.action = 'spectrum.import'", {
      replacements: [`Cli A ${RUN}`], type: QueryTypes.SELECT,
    });
    expect(ev).toEqual([{ actorId: null, actorEmail: 'cli' }]);
  });

  it('reports duplicates and exits 1 when any file is rejected (globs too)', () => {
    fs.writeFileSync(path.join(dir, 'broken.jdx'), '##TITLE= broken\n##JCAMP-DX= 5.01\n');
    const r = runCli([path.join(dir, '*.jdx')]);
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/a\.jdx\s+duplicate/);
    expect(r.stdout).toMatch(/broken\.jdx\s+rejected\s+-\s+missing ##END=/);
  });

  it('exits 2 with a message for a path that does not exist', () => {
    const r = runCli([path.join(dir, 'nothing-here.jdx')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/no such file or folder/);
  });
});
