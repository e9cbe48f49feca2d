// The API-keys screen: issue a key for a user (the secret is shown once),
// list keys, revoke. A key acts as its owner with the owner's roles.
import { useEffect, useState } from 'react';
import { apiCall } from '../../lib/auth-client';

interface Key { id: string; name: string | null; start: string | null; userId: string; userEmail: string | null; enabled: boolean; createdAt: string; expiresAt: string | null; lastRequest: string | null }
interface User { id: string; email: string; name: string; roles: string[]; active: boolean }

export default function ApiKeysAdmin() {
  const [keys, setKeys] = useState<Key[]>([]);
  const [users, setUsers] = useState<User[]>([]);
  const [form, setForm] = useState({ userId: '', name: '', expiresInDays: '' });
  const [issued, setIssued] = useState<{ key: string; name: string; email: string } | null>(null);
  const [message, setMessage] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function load() {
    try {
      const [k, u] = await Promise.all([apiCall('/api/admin/api-keys'), apiCall('/api/admin/users')]);
      setKeys(k.items);
      setUsers(u.items.filter((x: User) => x.active));
    } catch (e) {
      setMessage({ kind: 'error', text: (e as Error).message });
    }
  }
  useEffect(() => {
    void load();
  }, []);

  async function issue(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    setIssued(null);
    try {
      const r = await apiCall('/api/admin/api-keys', { body: { userId: form.userId, name: form.name, expiresInDays: form.expiresInDays ? Number(form.expiresInDays) : null } });
      setIssued({ key: r.apiKey.key, name: r.apiKey.name, email: users.find((u) => u.id === form.userId)?.email ?? '' });
      setForm({ userId: '', name: '', expiresInDays: '' });
      await load();
    } catch (err) {
      setMessage({ kind: 'error', text: (err as Error).message });
    } finally {
      setBusy(false);
    }
  }

  async function revoke(k: Key) {
    if (!window.confirm(`Revoke the key "${k.name}" of ${k.userEmail}? Its next request is refused.`)) return;
    setBusy(true);
    try {
      await apiCall(`/api/admin/api-keys/${encodeURIComponent(k.id)}`, { method: 'DELETE' });
      setMessage({ kind: 'ok', text: `The key "${k.name}" is revoked.` });
      await load();
    } catch (err) {
      setMessage({ kind: 'error', text: (err as Error).message });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-6">
      <section className="card">
        <h2 className="text-lg font-bold">Issue a key</h2>
        <p className="mt-1 text-sm text-muted">For an instrument, a LIMS or a script. The key acts as the chosen person, with that person's roles; send it as <code>Authorization: Bearer …</code> or in the <code>x-api-key</code> header.</p>
        <form className="mt-4 grid gap-4 md:grid-cols-3" onSubmit={issue} data-testid="issue-key-form">
          <div>
            <label className="label" htmlFor="key-user">Acts as</label>
            <select id="key-user" className="field" required value={form.userId} onChange={(e) => setForm({ ...form, userId: e.target.value })}>
              <option value="">choose a person…</option>
              {users.map((u) => <option key={u.id} value={u.id}>{u.name} · {u.email} ({u.roles.join(', ')})</option>)}
            </select>
          </div>
          <div>
            <label className="label" htmlFor="key-name">Name</label>
            <input id="key-name" className="field" required maxLength={80} placeholder="e.g. GC-MS 2 export" value={form.name} onChange={(e) => setForm({ ...form, name: e.target.value })} />
          </div>
          <div>
            <label className="label" htmlFor="key-expiry">Expires after (days, optional)</label>
            <input id="key-expiry" className="field" type="number" min={1} max={730} value={form.expiresInDays} onChange={(e) => setForm({ ...form, expiresInDays: e.target.value })} />
          </div>
          <div className="md:col-span-3"><button className="btn-primary" disabled={busy} data-testid="issue-key">Issue key</button></div>
        </form>
        {issued && (
          <div className="caution mt-4" data-testid="issued-key">
            <p className="font-semibold">Copy the key "{issued.name}" for {issued.email} now: it is shown only this once.</p>
            <code className="mt-2 block break-all rounded bg-white px-3 py-2 font-mono text-sm" data-testid="issued-key-value">{issued.key}</code>
          </div>
        )}
      </section>
      {message && <p role={message.kind === 'error' ? 'alert' : 'status'} className={`rounded-md px-3 py-2 text-sm ${message.kind === 'error' ? 'bg-alert-soft text-alert' : 'bg-teal-soft'}`}>{message.text}</p>}
      <section className="card">
        <h2 className="text-lg font-bold">Keys</h2>
        <div className="mt-3 overflow-x-auto">
          <table className="data-table" data-testid="keys-table">
            <thead><tr><th>Name</th><th>Starts with</th><th>Acts as</th><th>State</th><th>Issued</th><th>Expires</th><th>Last used</th><th /></tr></thead>
            <tbody>
              {keys.length === 0 && <tr><td colSpan={8} className="text-muted">No keys yet.</td></tr>}
              {keys.map((k) => (
                <tr key={k.id} data-testid="key-row">
                  <td>{k.name}</td>
                  <td><code>{k.start}…</code></td>
                  <td>{k.userEmail ?? <span className="text-muted">deleted user</span>}</td>
                  <td>{k.enabled ? <span className="badge bg-teal-soft text-teal">active</span> : <span className="badge bg-line/60 text-muted">disabled</span>}</td>
                  <td>{new Date(k.createdAt).toLocaleDateString()}</td>
                  <td>{k.expiresAt ? new Date(k.expiresAt).toLocaleDateString() : 'never'}</td>
                  <td>{k.lastRequest ? new Date(k.lastRequest).toLocaleString() : '—'}</td>
                  <td><button className="btn-danger !py-1 text-sm" disabled={busy} onClick={() => revoke(k)} data-testid="revoke-key">Revoke</button></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
    </div>
  );
}
