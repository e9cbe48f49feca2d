// What the report page and its print view both do first: read the report as
// the caller may see it, or say in words why not (with the HTTP status).
import { HttpError } from '../http';
import { getReportView, type ReportView } from './view';

export interface ReportPageLoad {
  report: ReportView | null;
  problem: { status: number; message: string } | null;
}

export async function loadReportPage(idParam: string | undefined, user: Parameters<typeof getReportView>[1], context: string): Promise<ReportPageLoad> {
  const id = Number(idParam);
  if (!Number.isInteger(id) || id <= 0) return { report: null, problem: { status: 404, message: 'There is no such report.' } };
  try {
    return { report: await getReportView(id, user), problem: null };
  } catch (e) {
    if (e instanceof HttpError) return { report: null, problem: { status: e.status, message: e.message } };
    console.error(`[${context}]`, (e as Error).message);
    return { report: null, problem: { status: 503, message: 'The report could not be read right now; try again shortly.' } };
  }
}

/** A UTC time as the report pages print it. */
export function reportTime(s: string | null | undefined): string {
  return s ? `${new Date(s).toISOString().slice(0, 19).replace('T', ' ')} UTC` : '—';
}
