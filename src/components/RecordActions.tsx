// What a curator may do with the version on screen: submit it for review,
// approve it (an electronic signature: the password re-entered), send it back,
// or retire it. POST /api/spectra/:id/review; errors shown in words.
import { useState } from 'react';

interface Props {
  recordId: number;
  version: number;
  status: string;
  canCurate: boolean;
  canApprove: boolean;
  /** the signed-in user edited or submitted this version (four-eyes rule: may not approve it) */
  ownWork: boolean;
}

type Action = 'submit' | 'approve' | 'return' | 'retire';

const EXPLAIN: Record<Action, string> = {
  submit: 'Submit this version for review by a second curator.',
  approve: 'Release this version. This is your electronic signature: re-enter your password.',
  return: 'Send this version back to its author with a comment.',
  retire: 'Take this record out of the searchable library. Its versions stay readable.',
};

export default function RecordActions({ recordId, version, status, canCurate, canApprove, ownWork }: Props) {
  const [open, setOpen] = useState<Action | null>(null);
  const [comment, setComment] = useState('');
  const [password, setPassword] = useState('');
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);

  const actions: Action[] = [];
  if (canCurate && status === 'draft') actions.push('submit');
  if (canApprove && status === 'in_review') actions.push('approve', 'return');
  if (canCurate && status === 'released') actions.push('retire');
  if (actions.length === 0) return null;

  async function send(action: Action) {
    setBusy(true);
    setMessage(null);
    try {
      const body: Record<string, unknown> = { action, version };
      if (action === 'approve') body.password = password;
      if (action === 'return' && comment) body.comment = comment;
      if (action === 'retire') body.reason = comment;
      if (action === 'submit' && comment) body.comment = comment;
      const res = await fetch(`/api/spectra/${recordId}/review`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      if (res.ok) {
        setMessage({ ok: true, text: 'Done. Reloading the record…' });
        window.setTimeout(() => window.location.assign(`/library/${recordId}`), 600);
        return;
      }
      const answer = await res.json().catch(() => null);
      const text = answer?.error?.message ?? `The server answered ${res.status}.`;
      setMessage({ ok: false, text: res.status === 404 && !answer?.error ? 'Reviewing records is not available on this server yet.' : text });
    } catch {
      setMessage({ ok: false, text: 'The server could not be reached.' });
    } finally {
      setBusy(false);
    }
  }

  const label: Record<Action, string> = { submit: 'Submit for review', approve: 'Approve and release', return: 'Send back', retire: 'Retire record' };
  return (
    <div className="space-y-3" data-testid="record-actions">
      <div className="flex flex-wrap gap-2">
        {actions.map((a) => (
          <button
            key={a}
            type="button"
            className={a === 'approve' ? 'btn-accent' : a === 'retire' ? 'btn-quiet text-alert' : 'btn-quiet'}
            aria-expanded={open === a}
            disabled={a === 'approve' && ownWork}
            title={a === 'approve' && ownWork ? 'You edited or submitted this version; another curator must approve it.' : undefined}
            onClick={() => {
              setOpen(open === a ? null : a);
              setMessage(null);
            }}
          >
            {label[a]}
          </button>
        ))}
      </div>
      {actions.includes('approve') && ownWork && <p className="text-xs text-muted">You edited or submitted this version, so another curator must approve it.</p>}
      {open && (
        <form
          className="space-y-2 rounded-md border border-line bg-paper p-3"
          onSubmit={(e) => {
            e.preventDefault();
            void send(open);
          }}
        >
          <p className="text-sm">{EXPLAIN[open]}</p>
          {open === 'approve' ? (
            <div>
              <label className="label" htmlFor="approve-password">Your password</label>
              <input id="approve-password" type="password" autoComplete="current-password" className="field" required value={password} onChange={(e) => setPassword(e.target.value)} />
            </div>
          ) : (
            <div>
              <label className="label" htmlFor="review-comment">{open === 'retire' ? 'Reason (required)' : 'Comment'}</label>
              <textarea id="review-comment" className="field" rows={2} required={open === 'retire' || open === 'return'} value={comment} onChange={(e) => setComment(e.target.value)} />
            </div>
          )}
          <button type="submit" className="btn-primary" disabled={busy}>{busy ? 'Sending…' : label[open]}</button>
        </form>
      )}
      {message && <p role={message.ok ? 'status' : 'alert'} className={message.ok ? 'text-sm text-moss' : 'rounded-md bg-alert-soft px-3 py-2 text-sm text-alert'}>{message.text}</p>}
    </div>
  );
}
