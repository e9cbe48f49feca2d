// E-mail notices of the review workflow: reviewers on a submission, the
// author on a decision. A notice links to the report and carries nothing of
// its content beyond the title (no peaks, hits or conclusion).
import { getConfig } from '../config';
import { sendMail } from '../mail/index';
import { reportLabel } from './reportLabel';

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export function reportLink(id: number): string {
  return `${getConfig().publicOrigin.replace(/\/$/, '')}/reports/${id}`;
}

interface Person { name: string; email: string }

function message(to: Person, subject: string, lines: string[], id: number) {
  const link = reportLink(id);
  const text = [`Hello ${to.name},`, '', ...lines, '', `Open the report: ${link}`, '', '— Ionotheca'].join('\n');
  const html = `<p>Hello ${esc(to.name)},</p>${lines.map((l) => `<p>${esc(l)}</p>`).join('')}<p><a href="${esc(link)}">Open the report ${esc(reportLabel(id))}</a></p><p>— Ionotheca</p>`;
  return { to: to.email, subject, text, html };
}

async function deliver(list: ReturnType<typeof message>[]): Promise<{ sent: number; failed: string[] }> {
  const failed: string[] = [];
  for (const m of list) {
    try {
      await sendMail(m);
    } catch (e) {
      // A mail problem must not undo a committed workflow step; it is logged and reported back.
      console.error(`[reports] notice to ${m.to} failed:`, (e as Error).message);
      failed.push(m.to);
    }
  }
  return { sent: list.length - failed.length, failed };
}

export function notifyReviewers(report: { id: number; title: string }, author: Person, reviewers: Person[], resubmitted: boolean) {
  const label = reportLabel(report.id);
  return deliver(reviewers.map((r) => message(
    r,
    `${label} ${resubmitted ? 'resubmitted' : 'submitted'} for review: ${report.title}`,
    [`${author.name} ${resubmitted ? 'resubmitted' : 'submitted'} the identification report ${label} "${report.title}" for review.`, 'You are asked to review it because you are a curator who did not write it.'],
    report.id,
  )));
}

export function notifyAuthor(report: { id: number; title: string }, author: Person, reviewer: Person, decision: 'approved' | 'returned') {
  const label = reportLabel(report.id);
  const lines = decision === 'approved'
    ? [`${reviewer.name} reviewed and approved your identification report ${label} "${report.title}".`]
    : [`${reviewer.name} returned your identification report ${label} "${report.title}" with a comment.`, 'Read the comment in the report, change what is needed and resubmit it.'];
  return deliver([message(author, `${label} ${decision}: ${report.title}`, lines, report.id)]);
}
