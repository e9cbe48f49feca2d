import { useState } from 'react';
import PasswordFields, { passwordProblem } from './PasswordFields';

export default function AcceptInvitationForm({ token, email, name: initialName }: { token: string; email: string; name: string }) {
  const [name, setName] = useState(initialName);
  const [password, setPassword] = useState('');
  const [confirm, setConfirm] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    const problem = passwordProblem(password, confirm);
    if (problem) return setError(problem);
    setBusy(true);
    setError(null);
    try {
      const res = await fetch('/api/invitations/accept', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ token, password, name }) });
      const body = await res.json().catch(() => ({}));
      if (!res.ok) throw new Error(body?.error?.message ?? 'The password could not be set.');
      setDone(true);
    } catch (err) {
      setError((err as Error).message);
    } finally {
      setBusy(false);
    }
  }

  if (done) {
    return (
      <div className="mt-5 space-y-3" data-testid="invitation-accepted">
        <p>Your account is ready. Sign in with <strong>{email}</strong> and the password you chose.</p>
        <a className="btn-primary no-underline" href={`/sign-in?email=${encodeURIComponent(email)}`}>Go to sign-in</a>
      </div>
    );
  }
  return (
    <form onSubmit={submit} className="mt-5 space-y-4" data-testid="accept-invitation-form">
      <div>
        <label className="label" htmlFor="invite-email">E-mail</label>
        <input id="invite-email" className="field bg-paper" value={email} readOnly autoComplete="username" />
      </div>
      <div>
        <label className="label" htmlFor="invite-name">Your name</label>
        <input id="invite-name" className="field" value={name} onChange={(e) => setName(e.target.value)} required maxLength={255} autoComplete="name" />
      </div>
      <PasswordFields password={password} confirm={confirm} onPassword={setPassword} onConfirm={setConfirm} />
      {error && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert">{error}</p>}
      <button type="submit" className="btn-primary w-full justify-center" disabled={busy}>{busy ? 'Saving…' : 'Set password'}</button>
    </form>
  );
}
