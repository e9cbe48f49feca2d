// The review queue's island: each version in review with its diff against
// the version before, its peaks as a small stick plot, the import warnings,
// and the reviewer's two choices. Approving is an electronic signature (the
// password re-entered); it is not offered at all on one's own work.
import { useState } from 'react';

// Type-only: the queue's items come from the server exactly in this shape.
export type { ReviewItem as ReviewItemView } from '../lib/curation/reviewQueue';
import type { ReviewItem as ReviewItemView } from '../lib/curation/reviewQueue';

const MEANING = 'reviewed and approved for release';

function show(v: unknown): string {
  if (v === null || v === undefined || v === '') return '—';
  if (Array.isArray(v)) {
    if (v.length === 0) return '—';
    return v.map((x) => (typeof x === 'object' && x ? Object.values(x as Record<string, unknown>).filter((y) => y !== null && y !== '').join(' ') : String(x))).join('; ');
  }
  return String(v);
}

function Sticks({ peaks }: { peaks: [number, number][] }) {
  if (peaks.length === 0) return null;
  const maxMz = Math.max(...peaks.map(([m]) => m));
  const minMz = Math.min(...peaks.map(([m]) => m));
  const top = Math.max(...peaks.map(([, i]) => i));
  const lo = Math.max(0, Math.floor(minMz / 10) * 10 - 5);
  const hi = Math.ceil(maxMz / 10) * 10 + 5;
  const x = (mz: number) => 30 + ((mz - lo) / (hi - lo || 1)) * 560;
  return (
    <svg viewBox="0 0 600 130" className="h-32 w-full" role="img" aria-label={`Stick plot, ${peaks.length} peaks, m/z ${minMz} to ${maxMz}`}>
      <line x1="30" y1="110" x2="590" y2="110" stroke="currentColor" strokeOpacity="0.4" />
      {peaks.map(([mz, i], k) => (
        <line key={k} x1={x(mz)} x2={x(mz)} y1="110" y2={110 - (i / top) * 100} stroke="var(--color-teal)" strokeWidth="1.5" />
      ))}
      <text x="30" y="125" fontSize="10" fill="currentColor">{lo}</text>
      <text x="590" y="125" fontSize="10" textAnchor="end" fill="currentColor">{hi} m/z</text>
    </svg>
  );
}

function Card({ item, onDone }: { item: ReviewItemView; onDone: (text: string) => void }) {
  const [mode, setMode] = useState<'approve' | 'return' | null>(null);
  const [password, setPassword] = useState('');
  const [comment, setComment] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function send(action: 'approve' | 'return') {
    setError(null);
    if (action === 'approve' && !password) return setError('Re-enter your password to sign the approval.');
    if (action === 'return' && !comment.trim()) return setError('Say what needs to change.');
    setBusy(true);
    try {
      const res = await fetch(`/api/spectra/${item.recordId}/review`, {
        method: 'POST', headers: { 'content-type': 'application/json' },
        body: JSON.stringify(action === 'approve' ? { action, password, version: item.version, ...(comment.trim() ? { comment: comment.trim() } : {}) } : { action, comment: comment.trim(), version: item.version }),
      });
      const body = await res.json().catch(() => null);
      if (!res.ok) {
        setError(body?.error?.message ?? `The server answered ${res.status}.`);
        setPassword('');
        return;
      }
      onDone(action === 'approve'
        ? `${item.name}, version ${item.version}, released: signed by ${body?.signature?.signerName ?? 'you'} at ${body?.signature?.signedAt ? new Date(body.signature.signedAt).toISOString().replace('T', ' ').slice(0, 19) + ' UTC' : 'now'}.`
        : `${item.name}, version ${item.version}, sent back to draft with your comment.`);
    } catch {
      setError('The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <article className="card space-y-3" data-testid="review-item" data-record-id={item.recordId} data-version={item.version}>
      <header className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h2 className="text-lg font-semibold"><a href={`/library/${item.recordId}?version=${item.version}`}>{item.name}</a></h2>
        <span className="font-mono text-sm">{item.formula ?? 'no formula'}</span>
        <span className="text-sm text-muted">record {item.recordId} · version {item.version}{item.previous ? ` (against version ${item.previous.version}, ${item.previous.status})` : ' (first version)'}</span>
        {item.synthetic && <span className="badge-synthetic">synthetic demo</span>}
      </header>
      <p className="text-sm text-muted">
        Submitted by {item.submittedBy ?? 'someone'}{item.submittedAt ? ` on ${item.submittedAt.replace('T', ' ').slice(0, 16)} UTC` : ''}
        {item.editors.length > 0 && <> · edited by {item.editors.join(', ')}</>}
        {item.sourceFileName && <> · from {item.sourceFileName}</>}
      </p>
      {item.changeReason && <p className="text-sm"><span className="font-semibold">Reason for the change:</span> {item.changeReason}</p>}

      <div className="grid gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="overflow-x-auto">
          <table className="data-table text-sm" data-testid="review-diff">
            <thead><tr><th scope="col">Field</th><th scope="col">{item.previous ? `Version ${item.previous.version}` : 'Before'}</th><th scope="col">Version {item.version}</th></tr></thead>
            <tbody>
              {item.diff.length === 0 && <tr><td colSpan={3} className="text-muted">No field differs from the version before.</td></tr>}
              {item.diff.map((d) => (
                <tr key={d.field} data-field={d.field}>
                  <th scope="row" className="!bg-transparent">{d.label}</th>
                  <td className="text-muted line-through decoration-alert/60">{show(d.before)}</td>
                  <td className="font-semibold">{show(d.after)}</td>
                </tr>
              ))}
              <tr>
                <th scope="row" className="!bg-transparent">Peaks</th>
                <td className="text-muted">{item.peaks.before ?? '—'}</td>
                <td>{item.peaks.after}{item.previous && (item.peaks.changed ? ` · changed (cosine ${item.peaks.cosine?.toFixed(4)})` : ' · unchanged')}</td>
              </tr>
            </tbody>
          </table>
        </div>
        <div>
          <Sticks peaks={item.peaks.list} />
          <p className="text-xs text-muted">{item.peakCount} peaks · base peak m/z {item.basePeakMz ?? '—'}{item.nominalMass !== null ? ` · nominal mass ${item.nominalMass}` : ''}</p>
        </div>
      </div>

      {item.warnings.length > 0 && (
        <ul className="caution list-disc pl-8">
          {item.warnings.map((w, i) => <li key={i}><span className="font-mono text-xs">{w.code}</span> {w.message}</li>)}
        </ul>
      )}

      <div className="space-y-2 border-t border-line pt-3">
        {!item.canApprove && <p className="text-sm text-muted" data-testid="review-blocked">You cannot approve or send back this version: {item.blockedBecause}. Another curator must review it.</p>}
        {item.canApprove && (
          <>
            <div className="flex flex-wrap gap-2">
              <button type="button" className="btn-accent" aria-expanded={mode === 'approve'} onClick={() => { setMode(mode === 'approve' ? null : 'approve'); setError(null); }} data-testid="approve-open">Approve and release</button>
              <button type="button" className="btn-quiet" aria-expanded={mode === 'return'} onClick={() => { setMode(mode === 'return' ? null : 'return'); setError(null); }} data-testid="return-open">Send back</button>
            </div>
            {mode && (
              <form className="space-y-2 rounded-md border border-line bg-paper p-3" onSubmit={(e) => { e.preventDefault(); void send(mode); }}>
                {mode === 'approve' ? (
                  <>
                    <p className="text-sm">Your electronic signature, with the meaning <strong>“{MEANING}”</strong>, your name and the UTC time, is stored with this version.</p>
                    <label className="label" htmlFor={`pw-${item.recordId}`}>Your password</label>
                    <input id={`pw-${item.recordId}`} type="password" autoComplete="current-password" className="field max-w-sm" value={password} onChange={(e) => setPassword(e.target.value)} data-testid="approve-password" />
                    <label className="label" htmlFor={`c-${item.recordId}`}>Comment <span className="font-normal text-muted">(optional)</span></label>
                    <input id={`c-${item.recordId}`} className="field" value={comment} onChange={(e) => setComment(e.target.value)} />
                  </>
                ) : (
                  <>
                    <label className="label" htmlFor={`r-${item.recordId}`}>What needs to change</label>
                    <textarea id={`r-${item.recordId}`} className="field h-20" value={comment} onChange={(e) => setComment(e.target.value)} data-testid="return-comment" />
                  </>
                )}
                {error && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert" data-testid="review-error">{error}</p>}
                <button type="submit" className={mode === 'approve' ? 'btn-accent' : 'btn-primary'} disabled={busy} data-testid={mode === 'approve' ? 'approve-sign' : 'return-send'}>
                  {busy ? 'Sending…' : mode === 'approve' ? 'Sign and release' : 'Send back to draft'}
                </button>
              </form>
            )}
          </>
        )}
      </div>
    </article>
  );
}

export default function ReviewQueue({ items: initial }: { items: ReviewItemView[] }) {
  const [items, setItems] = useState(initial);
  const [done, setDone] = useState<string[]>([]);
  return (
    <div className="space-y-4" data-testid="review-queue">
      {done.length > 0 && (
        <ul className="space-y-1" role="status" data-testid="review-done">
          {done.map((d, i) => <li key={i} className="rounded-md bg-teal-soft px-3 py-2 text-sm">{d}</li>)}
        </ul>
      )}
      {items.length === 0 && <p className="card text-muted" data-testid="review-empty">Nothing is waiting for review.</p>}
      {items.map((item) => (
        <Card key={`${item.recordId}-${item.version}`} item={item} onDone={(text) => { setDone((d) => [text, ...d]); setItems((list) => list.filter((x) => x !== item)); }} />
      ))}
    </div>
  );
}
