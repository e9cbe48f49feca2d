import { useState } from 'react';
import PasswordFields, { passwordProblem } from './PasswordFields';

/** Without a token: ask for a reset link by e-mail. With one: choose the new password. */
export default function ResetPasswordForm({ token, tokenError }: { token: string; tokenError: string }) {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [confirm, setConfirm] = useState('');
  const [error, setError] = useState<string | null>(tokenError ? 'This reset link is not valid any more. Ask for a new one below.' : null);
  const [done, setDone] = useState<null | 'sent' | 'reset'>(null);
  const [busy, setBusy] = useState(false);
  const withToken = !!token && !tokenError;

  async function post(path: string, body: unknown) {
    const res = await fetch(path, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
    const data = await res.json().catch(() => ({}));
    if (!res.ok) {
      if (res.status === 429) throw new Error('Too many requests from here. Wait a minute and try again.');
      if (data?.code === 'INVALID_TOKEN') throw new Error('This reset link has expired or has already been used. Ask for a new one.');
      throw new Error(data?.message ?? data?.error?.message ?? 'That did not work.');
    }
  }

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    if (withToken) {
      const problem = passwordProblem(password, confirm);
      if (problem) return setError(problem);
    }
    setBusy(true);
    try {
      if (withToken) {
        await post('/api/auth/reset-password', { token, newPassword: password });
        setDone('reset');
      } else {
        await post('/api/auth/request-password-reset', { email, redirectTo: '/reset-password' });
        setDone('sent');
      }
    } catch (err) {
      setError((err as Error).message);
    } finally {
      setBusy(false);
    }
  }

  if (done === 'sent') {
    return <p className="mt-5" data-testid="reset-requested">If an account exists for <strong>{email}</strong>, a message with a reset link is on its way. The link works once, for one hour.</p>;
  }
  if (done === 'reset') {
    return (
      <div className="mt-5 space-y-3" data-testid="reset-done">
        <p>Your password has been changed, and other sessions of your account have been signed out.</p>
        <a className="btn-primary no-underline" href="/sign-in">Go to sign-in</a>
      </div>
    );
  }
  return (
    <form onSubmit={submit} className="mt-5 space-y-4" data-testid={withToken ? 'new-password-form' : 'request-reset-form'}>
      {withToken ? (
        <PasswordFields password={password} confirm={confirm} onPassword={setPassword} onConfirm={setConfirm} />
      ) : (
        <div>
          <label className="label" htmlFor="reset-email">E-mail</label>
          <input id="reset-email" type="email" required className="field" autoComplete="username" value={email} onChange={(e) => setEmail(e.target.value)} />
        </div>
      )}
      {error && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert">{error}</p>}
      <button type="submit" className="btn-primary w-full justify-center" disabled={busy}>
        {busy ? 'Please wait…' : withToken ? 'Set new password' : 'Send reset link'}
      </button>
      <p className="text-sm"><a href="/sign-in">Back to sign-in</a></p>
    </form>
  );
}
