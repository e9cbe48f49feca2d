// Turn one of API.md's query forms (peaks, a JCAMP-DX text, or a library
// record) into a peak list.
import { QueryTypes } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { HttpError } from '../http';
import { can, type Role } from '../roles';
import { decodePeaks, readJcamp } from '../spectra/index';
import { MAX_QUERY_PEAKS, MAX_MZ } from './schemas';

export type Peak = [number, number];

export interface ResolvedQuery {
  peaks: Peak[];
  source: { kind: 'peaks' } | { kind: 'jcamp'; title: string | null } | { kind: 'record'; recordId: number; version: number; name: string };
}

export function checkPeaks(peaks: Peak[], field = 'peaks'): Peak[] {
  if (peaks.length === 0) throw new HttpError(400, 'invalid_input', `${field}: the spectrum has no peaks`);
  if (peaks.length > MAX_QUERY_PEAKS) throw new HttpError(400, 'invalid_input', `${field}: more than ${MAX_QUERY_PEAKS} peaks`);
  for (const [mz, y] of peaks) {
    if (!Number.isFinite(mz) || !Number.isFinite(y)) throw new HttpError(400, 'invalid_input', `${field}: a value is not a finite number`);
    if (mz <= 0 || mz > MAX_MZ) throw new HttpError(400, 'invalid_input', `${field}: m/z ${mz} is outside 0..${MAX_MZ}`);
    if (y < 0) throw new HttpError(400, 'invalid_input', `${field}: intensity ${y} at m/z ${mz} is negative`);
  }
  if (!peaks.some(([, y]) => y > 0)) throw new HttpError(400, 'invalid_input', `${field}: every intensity is zero`);
  return peaks;
}

export function peaksFromJcamp(text: string, field = 'jcamp'): { peaks: Peak[]; title: string | null }[] {
  const r = readJcamp(text, { fileName: 'query.jdx' });
  if (!r.ok) throw new HttpError(400, 'invalid_input', `${field}: ${r.error}`);
  if (r.spectra.length === 0) throw new HttpError(400, 'invalid_input', `${field}: no spectrum found`);
  return r.spectra.map((s) => ({ peaks: checkPeaks(s.peaks as Peak[], field), title: s.title ?? null }));
}

export async function resolveQuery(
  body: { peaks?: Peak[]; jcamp?: string; spectrumId?: number; version?: number },
  roles: readonly Role[],
): Promise<ResolvedQuery> {
  if (body.peaks) return { peaks: checkPeaks(body.peaks), source: { kind: 'peaks' } };
  if (body.jcamp !== undefined) {
    const [first] = peaksFromJcamp(body.jcamp);
    return { peaks: first.peaks, source: { kind: 'jcamp', title: first.title } };
  }
  const recordId = body.spectrumId!;
  const mayDraft = can(roles, 'curate') || can(roles, 'audit');
  const rows = await getSequelize().query<{ version: number; status: string; name: string; peaks: Buffer }>(
    body.version
      ? 'SELECT version, status, name, peaks FROM spectrum_version WHERE recordId = ? AND version = ?'
      : "SELECT v.version, v.status, v.name, v.peaks FROM spectrum_version v JOIN spectrum_record r ON r.id = v.recordId WHERE v.recordId = ? AND v.version = COALESCE(r.releasedVersion, r.latestVersion)",
    { replacements: body.version ? [recordId, body.version] : [recordId], type: QueryTypes.SELECT },
  );
  const row = rows[0];
  if (!row || (!mayDraft && !['released', 'superseded'].includes(row.status))) {
    throw new HttpError(404, 'not_found', `spectrumId: no record ${recordId}${body.version ? ` version ${body.version}` : ''} that you may read`);
  }
  return {
    peaks: checkPeaks(decodePeaks(row.peaks) as Peak[], 'spectrumId'),
    source: { kind: 'record', recordId, version: Number(row.version), name: row.name },
  };
}
