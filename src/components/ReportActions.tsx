// The review actions a caller's roles allow on one report: the author edits
// and submits a draft or returned report; another curator approves (an
// electronic signature: password re-entered) or returns it with a comment;
// anyone who writes reports may comment while it is open, and may start a
// correction (a new report that supersedes an approved one).
import { useState, type FormEvent } from 'react';

interface HitOption { spectrumId: number; version: number; rank: number; name: string; score: number }
interface Sample { sampleId?: string; retentionTime?: number; retentionIndex?: number; riPhase?: string; instrument?: string; method?: string; notes?: string }
interface Standard { name?: string; lot: string; analysisDate: string; retentionIndex?: number; notes?: string }

export interface ReportActionsProps {
  id: number;
  label: string;
  status: string;
  permissions: { edit: boolean; submit: boolean; approve: boolean; return: boolean; comment: boolean };
  title: string;
  conclusion: string | null;
  reasoning: string | null;
  sample: Sample;
  referenceStandard: Standard | null;
  selected: { recordId: number; version: number } | null;
  hits: HitOption[];
  openAlternatives: string[];
  meaning: string;
  /** A body for POST /api/reports that starts a correction (approved reports only). */
  correction?: Record<string, unknown> | null;
}

async function call(method: string, url: string, body: unknown): Promise<any> {
  const r = await fetch(url, { method, headers: { 'content-type': 'application/json', accept: 'application/json' }, body: JSON.stringify(body) });
  const data = await r.json().catch(() => null);
  if (!r.ok) {
    const details = Array.isArray(data?.error?.details) ? data.error.details.map((d: any) => d?.message).filter(Boolean) : [];
    const msg = data?.error?.message ?? `The server answered ${r.status}`;
    throw new Error(details.length > 1 ? `${msg}\n${details.slice(1).join('\n')}` : msg);
  }
  return data;
}

const num = (s: string) => (s.trim() === '' ? undefined : Number(s));
const str = (s: string) => (s.trim() === '' ? undefined : s.trim());

export default function ReportActions(p: ReportActionsProps) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [editing, setEditing] = useState(false);
  const [comment, setComment] = useState('');
  const [password, setPassword] = useState('');

  const [title, setTitle] = useState(p.title);
  const [conclusion, setConclusion] = useState(p.conclusion ?? '');
  const [reasoning, setReasoning] = useState(p.reasoning ?? '');
  const [selected, setSelected] = useState(p.selected ? `${p.selected.recordId}/${p.selected.version}` : '');
  const [sample, setSample] = useState({
    sampleId: p.sample.sampleId ?? '', retentionTime: p.sample.retentionTime?.toString() ?? '', retentionIndex: p.sample.retentionIndex?.toString() ?? '',
    riPhase: p.sample.riPhase ?? '', instrument: p.sample.instrument ?? '', method: p.sample.method ?? '', notes: p.sample.notes ?? '',
  });
  const [hasStandard, setHasStandard] = useState(!!p.referenceStandard);
  const [std, setStd] = useState({
    name: p.referenceStandard?.name ?? '', lot: p.referenceStandard?.lot ?? '', analysisDate: p.referenceStandard?.analysisDate ?? '',
    retentionIndex: p.referenceStandard?.retentionIndex?.toString() ?? '', notes: p.referenceStandard?.notes ?? '',
  });

  async function run(what: string, fn: () => Promise<unknown>, reload = true) {
    setBusy(true);
    setError(null);
    setDone(null);
    try {
      await fn();
      setDone(what);
      if (reload) location.reload();
    } catch (e) {
      setError((e as Error).message);
    } finally {
      setBusy(false);
    }
  }

  function save(e: FormEvent) {
    e.preventDefault();
    const [rid, ver] = selected ? selected.split('/').map(Number) : [];
    const body = {
      title: title.trim(),
      conclusion: conclusion || null,
      reasoning: reasoning.trim() || null,
      selected: selected ? { recordId: rid, version: ver } : null,
      sample: Object.fromEntries(Object.entries({
        sampleId: str(sample.sampleId), retentionTime: num(sample.retentionTime), retentionIndex: num(sample.retentionIndex), riPhase: str(sample.riPhase),
        instrument: str(sample.instrument), method: str(sample.method), notes: str(sample.notes),
      }).filter(([, v]) => v !== undefined)),
      referenceStandard: hasStandard
        ? Object.fromEntries(Object.entries({ name: str(std.name), lot: std.lot.trim(), analysisDate: std.analysisDate, retentionIndex: num(std.retentionIndex), notes: str(std.notes) }).filter(([, v]) => v !== undefined))
        : null,
    };
    void run('Saved.', () => call('PATCH', `/api/reports/${p.id}`, body));
  }

  const review = (action: string, extra: Record<string, unknown> = {}) => (e: FormEvent) => {
    e.preventDefault();
    void run(action === 'approve' ? 'Approved and signed.' : 'Done.', () => call('POST', `/api/reports/${p.id}/review`, { action, ...(comment.trim() ? { comment: comment.trim() } : {}), ...extra }));
  };

  const anything = p.permissions.edit || p.permissions.submit || p.permissions.approve || p.permissions.return || p.permissions.comment || !!p.correction;
  if (!anything) return null;

  return (
    <section className="card no-print" aria-labelledby="actions-h" data-testid="report-actions">
      <h2 id="actions-h" className="text-lg font-bold">Review actions</h2>
      {error && <p role="alert" className="mt-3 whitespace-pre-line rounded-md bg-alert-soft px-3 py-2 text-sm text-alert" data-testid="action-error">{error}</p>}
      {done && <p role="status" className="mt-3 rounded-md bg-teal-soft px-3 py-2 text-sm">{done}</p>}

      {p.permissions.edit && (
        <div className="mt-3">
          {!editing ? (
            <button type="button" className="btn-quiet" onClick={() => setEditing(true)} data-testid="edit-report">Edit the report</button>
          ) : (
            <form onSubmit={save} className="grid gap-3" data-testid="edit-form">
              <label><span className="label">Title</span><input className="field" value={title} onChange={(e) => setTitle(e.target.value)} required maxLength={255} /></label>
              <div className="grid gap-3 md:grid-cols-2">
                <label><span className="label">Selected hit</span>
                  <select className="field" value={selected} onChange={(e) => setSelected(e.target.value)} name="selected">
                    <option value="">none</option>
                    {p.hits.map((h) => <option key={`${h.spectrumId}/${h.version}`} value={`${h.spectrumId}/${h.version}`}>{h.rank}. {h.name} (#{h.spectrumId} v{h.version}, {h.score.toFixed(3)})</option>)}
                  </select>
                </label>
                <label><span className="label">Conclusion</span>
                  <select className="field" value={conclusion} onChange={(e) => setConclusion(e.target.value)} name="conclusion">
                    <option value="">not yet decided</option>
                    <option value="identified">Identified (needs a co-analysed reference standard and every criterion passing)</option>
                    <option value="tentative">Tentative</option>
                    <option value="not_in_library">Not in library</option>
                  </select>
                </label>
              </div>
              <label><span className="label">Reasoning</span>
                <textarea className="field min-h-32" value={reasoning} onChange={(e) => setReasoning(e.target.value)} name="reasoning" />
                {p.openAlternatives.length > 0 && <span className="mt-1 block text-sm text-copper">Address these alternatives by name or record id: {p.openAlternatives.join('; ')}</span>}
              </label>
              <fieldset className="grid gap-3 md:grid-cols-4">
                <legend className="label">Sample</legend>
                <label><span className="label">Sample id</span><input className="field" value={sample.sampleId} onChange={(e) => setSample({ ...sample, sampleId: e.target.value })} /></label>
                <label><span className="label">Retention time (min)</span><input className="field" inputMode="decimal" value={sample.retentionTime} onChange={(e) => setSample({ ...sample, retentionTime: e.target.value })} /></label>
                <label><span className="label">Retention index</span><input className="field" inputMode="decimal" value={sample.retentionIndex} onChange={(e) => setSample({ ...sample, retentionIndex: e.target.value })} /></label>
                <label><span className="label">RI phase</span><input className="field" placeholder="non-polar" value={sample.riPhase} onChange={(e) => setSample({ ...sample, riPhase: e.target.value })} /></label>
                <label className="md:col-span-2"><span className="label">Instrument</span><input className="field" value={sample.instrument} onChange={(e) => setSample({ ...sample, instrument: e.target.value })} /></label>
                <label className="md:col-span-2"><span className="label">Method</span><input className="field" value={sample.method} onChange={(e) => setSample({ ...sample, method: e.target.value })} /></label>
              </fieldset>
              <fieldset className="grid gap-3 md:grid-cols-4">
                <legend className="label">
                  <label className="flex items-center gap-2"><input type="checkbox" checked={hasStandard} onChange={(e) => setHasStandard(e.target.checked)} /> An authentic reference standard was analysed alongside the sample</label>
                </legend>
                {hasStandard && (
                  <>
                    <label><span className="label">Standard</span><input className="field" value={std.name} onChange={(e) => setStd({ ...std, name: e.target.value })} /></label>
                    <label><span className="label">Lot</span><input className="field" value={std.lot} onChange={(e) => setStd({ ...std, lot: e.target.value })} required /></label>
                    <label><span className="label">Analysis date</span><input type="date" className="field" value={std.analysisDate} onChange={(e) => setStd({ ...std, analysisDate: e.target.value })} required /></label>
                    <label><span className="label">Its retention index</span><input className="field" inputMode="decimal" value={std.retentionIndex} onChange={(e) => setStd({ ...std, retentionIndex: e.target.value })} /></label>
                  </>
                )}
              </fieldset>
              <div className="flex gap-2">
                <button className="btn-primary" disabled={busy} type="submit">Save changes</button>
                <button className="btn-quiet" type="button" onClick={() => setEditing(false)}>Cancel</button>
              </div>
            </form>
          )}
        </div>
      )}

      {(p.permissions.submit || p.permissions.approve || p.permissions.return || p.permissions.comment) && (
        <form className="mt-4 grid gap-3" onSubmit={(e) => e.preventDefault()}>
          <label><span className="label">Comment{p.permissions.return ? ' (required to return the report)' : ''}</span>
            <textarea className="field min-h-20" value={comment} onChange={(e) => setComment(e.target.value)} name="comment" data-testid="review-comment" />
          </label>
          {p.permissions.approve && (
            <label className="max-w-sm"><span className="label">Your password, to sign</span>
              <input type="password" className="field" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} name="password" data-testid="sign-password" />
              <span className="mt-1 block text-xs text-muted">Approving is an electronic signature with the meaning “{p.meaning}”, recorded with your name and the time (UTC).</span>
            </label>
          )}
          <div className="flex flex-wrap gap-2">
            {p.permissions.submit && <button className="btn-primary" disabled={busy} onClick={review('submit')} data-testid="submit-report">{p.status === 'returned' ? 'Resubmit for review' : 'Submit for review'}</button>}
            {p.permissions.approve && <button className="btn-accent" disabled={busy || !password} onClick={review('approve', { password })} data-testid="approve-report">Approve and sign</button>}
            {p.permissions.return && <button className="btn-quiet" disabled={busy || !comment.trim()} onClick={review('return')} data-testid="return-report">Return with comment</button>}
            {p.permissions.comment && <button className="btn-quiet" disabled={busy || !comment.trim()} onClick={review('comment')} data-testid="add-comment">Add comment</button>}
          </div>
        </form>
      )}

      {p.correction && (
        <div className="mt-4">
          <p className="text-sm text-muted">An approved report is read-only. A correction is a new report that supersedes this one.</p>
          <button
            type="button"
            className="btn-quiet mt-2"
            disabled={busy}
            data-testid="start-correction"
            onClick={() => void run('Correction started.', async () => {
              const r = await call('POST', '/api/reports', p.correction);
              location.href = `/reports/${r.id}`;
            }, false)}
          >Start a correction of {p.label}</button>
        </div>
      )}
    </section>
  );
}
