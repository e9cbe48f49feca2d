import type { APIRoute } from 'astro';
import { QueryTypes } from 'sequelize';
import { json } from '../../lib/http';
import { getSequelize } from '../../lib/db/sequelize';
import { runtimeStatus } from '../../lib/runtime';
import { libraryIndexStatus } from '../../lib/library-index';

// GET /api/health: { status, db, library: { spectra, records, version } }.
// 503 while the database is unreachable; "ok" only once start-up is complete.
export const GET: APIRoute = async () => {
  const rt = runtimeStatus();
  const idx = libraryIndexStatus();
  let db: 'up' | 'down' = 'down';
  let records = 0;
  try {
    const [row] = await getSequelize().query<{ n: number }>('SELECT COUNT(*) AS n FROM spectrum_record', { type: QueryTypes.SELECT });
    records = Number(row?.n ?? 0);
    db = 'up';
  } catch {
    db = 'down';
  }
  const ok = db === 'up' && rt.ready && idx.ready;
  return json(
    {
      status: ok ? 'ok' : 'degraded',
      db,
      ready: rt.ready && idx.ready,
      ...(rt.error ? { message: rt.error } : {}),
      library: { spectra: idx.spectra, records, version: idx.version },
    },
    db === 'up' ? 200 : 503,
  );
};
