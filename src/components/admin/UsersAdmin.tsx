// The users screen: people and pending invitations in one table (sort,
// filter, page), role changes with several roles per person, deactivate /
// reactivate, clear a sign-in lock, resend an invitation, invite someone.
import { useEffect, useMemo, useState } from 'react';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { apiCall } from '../../lib/auth-client';

const ROLES = ['viewer', 'analyst', 'curator', 'auditor', 'admin'] as const;
type Role = (typeof ROLES)[number];

interface Row {
  key: string;
  kind: 'user' | 'invitation';
  id: string;
  name: string;
  email: string;
  roles: Role[];
  status: 'active' | 'deactivated' | 'locked' | 'invited' | 'invitation expired';
  since: string;
  detail: string;
}

const STATUS_STYLE: Record<Row['status'], string> = {
  active: 'bg-teal-soft text-teal',
  deactivated: 'bg-line/60 text-muted',
  locked: 'bg-alert-soft text-alert',
  invited: 'bg-copper-soft text-copper',
  'invitation expired': 'bg-line/60 text-muted',
};

function RoleChecks({ value, onChange, idPrefix }: { value: Role[]; onChange: (r: Role[]) => void; idPrefix: string }) {
  return (
    <div className="flex flex-wrap gap-3">
      {ROLES.map((r) => (
        <label key={r} className="inline-flex items-center gap-1.5 text-sm" htmlFor={`${idPrefix}-${r}`}>
          <input
            id={`${idPrefix}-${r}`}
            type="checkbox"
            name={`${idPrefix}-role`}
            value={r}
            checked={value.includes(r)}
            onChange={(e) => onChange(e.target.checked ? ROLES.filter((x) => x === r || value.includes(x)) : value.filter((x) => x !== r))}
          />
          {r}
        </label>
      ))}
    </div>
  );
}

const col = createColumnHelper<Row>();

export default function UsersAdmin({ selfId }: { selfId: string }) {
  const [rows, setRows] = useState<Row[]>([]);
  const [loading, setLoading] = useState(true);
  const [message, setMessage] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'email', desc: false }]);
  const [filter, setFilter] = useState('');
  const [statusFilter, setStatusFilter] = useState('');
  const [editing, setEditing] = useState<{ id: string; roles: Role[] } | null>(null);
  const [invite, setInvite] = useState<{ email: string; name: string; roles: Role[] }>({ email: '', name: '', roles: ['viewer'] });
  const [busy, setBusy] = useState(false);

  async function load() {
    setLoading(true);
    try {
      const [u, i] = await Promise.all([apiCall('/api/admin/users'), apiCall('/api/admin/invitations')]);
      const userRows: Row[] = u.items.map((x: any) => ({
        key: `u:${x.id}`, kind: 'user', id: x.id, name: x.name, email: x.email, roles: x.roles,
        status: !x.active ? 'deactivated' : x.lockedUntil ? 'locked' : 'active', since: x.createdAt,
        detail: x.lockedUntil ? `locked until ${new Date(x.lockedUntil).toLocaleTimeString()}` : `${x.activeSessions} session(s), ${x.apiKeys} key(s)`,
      }));
      const userEmails = new Set(userRows.map((r) => r.email.toLowerCase()));
      const invRows: Row[] = i.items
        .filter((x: any) => x.status !== 'accepted' && !userEmails.has(x.email.toLowerCase()))
        .map((x: any) => ({
          key: `i:${x.id}`, kind: 'invitation', id: String(x.id), name: x.name ?? '', email: x.email, roles: x.roles,
          status: x.status === 'expired' ? 'invitation expired' : 'invited', since: x.createdAt,
          detail: x.status === 'expired' ? 'link expired' : `link valid until ${new Date(x.expiresAt).toLocaleString()}`,
        }));
      setRows([...userRows, ...invRows]);
    } catch (e) {
      setMessage({ kind: 'error', text: (e as Error).message });
    } finally {
      setLoading(false);
    }
  }
  useEffect(() => {
    void load();
  }, []);

  async function act(fn: () => Promise<unknown>, ok: string) {
    setBusy(true);
    setMessage(null);
    try {
      await fn();
      setMessage({ kind: 'ok', text: ok });
      setEditing(null);
      await load();
    } catch (e) {
      setMessage({ kind: 'error', text: (e as Error).message });
    } finally {
      setBusy(false);
    }
  }

  const columns = useMemo(
    () => [
      col.accessor('name', { header: 'Name', cell: (c) => c.getValue() || <span className="text-muted">—</span> }),
      col.accessor('email', { header: 'E-mail' }),
      col.accessor((r) => r.roles.join(', '), {
        id: 'roles',
        header: 'Roles',
        cell: (c) => {
          const r = c.row.original;
          if (editing && editing.id === r.id && r.kind === 'user') {
            return (
              <div className="space-y-2" data-testid="role-editor">
                <RoleChecks value={editing.roles} onChange={(roles) => setEditing({ id: r.id, roles })} idPrefix={`roles-${r.id}`} />
                <div className="flex gap-2">
                  <button className="btn-primary !py-1 text-sm" disabled={busy || editing.roles.length === 0} data-testid="save-roles"
                    onClick={() => act(() => apiCall(`/api/admin/users/${encodeURIComponent(r.id)}`, { method: 'PATCH', body: { roles: editing.roles } }), `Roles of ${r.email} saved.`)}>Save</button>
                  <button className="btn-quiet !py-1 text-sm" onClick={() => setEditing(null)}>Cancel</button>
                </div>
              </div>
            );
          }
          return c.getValue();
        },
      }),
      col.accessor('status', {
        header: 'Status',
        cell: (c) => (
          <div>
            <span className={`badge ${STATUS_STYLE[c.getValue()]}`}>{c.getValue()}</span>
            <div className="mt-1 text-xs text-muted">{c.row.original.detail}</div>
          </div>
        ),
      }),
      col.accessor('since', { header: 'Since', cell: (c) => new Date(c.getValue()).toLocaleDateString() }),
      col.display({
        id: 'actions',
        header: '',
        cell: (c) => {
          const r = c.row.original;
          if (r.kind === 'invitation') {
            return (
              <button className="btn-quiet !py-1 text-sm" disabled={busy} data-testid="resend-invitation"
                onClick={() => act(() => apiCall(`/api/admin/invitations/${r.id}/resend`, { method: 'POST', body: {} }), `A new invitation link went to ${r.email}.`)}>Resend invitation</button>
            );
          }
          return (
            <div className="flex flex-wrap gap-2">
              <button className="btn-quiet !py-1 text-sm" disabled={busy} data-testid="edit-roles" onClick={() => setEditing({ id: r.id, roles: r.roles })}>Roles…</button>
              {r.status === 'locked' && (
                <button className="btn-quiet !py-1 text-sm" disabled={busy} data-testid="clear-lock"
                  onClick={() => act(() => apiCall('/api/admin/lockouts/clear', { body: { email: r.email } }), `The sign-in lock of ${r.email} is cleared.`)}>Clear lock</button>
              )}
              {r.id !== selfId && (r.status === 'deactivated' ? (
                <button className="btn-quiet !py-1 text-sm" disabled={busy} data-testid="reactivate"
                  onClick={() => act(() => apiCall(`/api/admin/users/${encodeURIComponent(r.id)}`, { method: 'PATCH', body: { active: true } }), `${r.email} can sign in again. Their old API keys stay disabled.`)}>Reactivate</button>
              ) : (
                <button className="btn-danger !py-1 text-sm" disabled={busy} data-testid="deactivate"
                  onClick={() => {
                    if (window.confirm(`Deactivate ${r.email}? Their sessions end and their API keys stop working at once.`))
                      void act(() => apiCall(`/api/admin/users/${encodeURIComponent(r.id)}`, { method: 'PATCH', body: { active: false } }), `${r.email} is deactivated.`);
                  }}>Deactivate</button>
              ))}
            </div>
          );
        },
      }),
    ],
    [editing, busy, selfId],
  );

  const data = useMemo(() => (statusFilter ? rows.filter((r) => r.status === statusFilter) : rows), [rows, statusFilter]);
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    getRowId: (r) => r.key,
    globalFilterFn: (row, _id, value) => {
      const v = String(value).toLowerCase();
      const r = row.original;
      return [r.name, r.email, r.roles.join(' '), r.status].some((s) => s.toLowerCase().includes(v));
    },
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageSize: 10 } },
  });

  return (
    <div className="space-y-6">
      <section className="card">
        <h2 className="text-lg font-bold">Invite someone</h2>
        <p className="mt-1 text-sm text-muted">They get an e-mail with a link to set their password. The link works once and expires after 72 hours.</p>
        <form
          className="mt-4 grid gap-4 md:grid-cols-[1fr_1fr_auto]"
          data-testid="invite-form"
          onSubmit={(e) => {
            e.preventDefault();
            void act(async () => {
              await apiCall('/api/admin/invitations', { body: { email: invite.email, name: invite.name || null, roles: invite.roles } });
              setInvite({ email: '', name: '', roles: ['viewer'] });
            }, `Invitation sent to ${invite.email}.`);
          }}
        >
          <div>
            <label className="label" htmlFor="invite-email">E-mail</label>
            <input id="invite-email" type="email" required className="field" value={invite.email} onChange={(e) => setInvite({ ...invite, email: e.target.value })} />
          </div>
          <div>
            <label className="label" htmlFor="invite-name">Name (optional)</label>
            <input id="invite-name" className="field" value={invite.name} onChange={(e) => setInvite({ ...invite, name: e.target.value })} />
          </div>
          <div className="md:col-span-3">
            <span className="label">Roles</span>
            <RoleChecks value={invite.roles} onChange={(roles) => setInvite({ ...invite, roles })} idPrefix="invite" />
          </div>
          <div className="md:col-span-3">
            <button type="submit" className="btn-primary" disabled={busy || invite.roles.length === 0} data-testid="send-invitation">Send invitation</button>
          </div>
        </form>
      </section>

      {message && (
        <p role={message.kind === 'error' ? 'alert' : 'status'} data-testid="admin-message"
          className={`rounded-md px-3 py-2 text-sm ${message.kind === 'error' ? 'bg-alert-soft text-alert' : 'bg-teal-soft text-ink'}`}>{message.text}</p>
      )}

      <section className="card">
        <div className="flex flex-wrap items-end gap-4">
          <h2 className="mr-auto text-lg font-bold">People</h2>
          <div>
            <label className="label" htmlFor="user-filter">Filter</label>
            <input id="user-filter" className="field" placeholder="name, e-mail, role…" value={filter} onChange={(e) => setFilter(e.target.value)} />
          </div>
          <div>
            <label className="label" htmlFor="status-filter">Status</label>
            <select id="status-filter" className="field" value={statusFilter} onChange={(e) => setStatusFilter(e.target.value)}>
              <option value="">all</option>
              {Object.keys(STATUS_STYLE).map((s) => <option key={s} value={s}>{s}</option>)}
            </select>
          </div>
        </div>
        <div className="mt-4 overflow-x-auto">
          <table className="data-table" data-testid="users-table">
            <thead>
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((h) => (
                    <th key={h.id} aria-sort={h.column.getIsSorted() === 'asc' ? 'ascending' : h.column.getIsSorted() === 'desc' ? 'descending' : 'none'}>
                      {h.column.getCanSort() ? (
                        <button type="button" className="font-semibold" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          {{ asc: ' ▲', desc: ' ▼' }[h.column.getIsSorted() as string] ?? ''}
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  ))}
                </tr>
              ))}
            </thead>
            <tbody>
              {loading && rows.length === 0 ? (
                <tr><td colSpan={6}><div className="skeleton h-6 w-full" /></td></tr>
              ) : table.getRowModel().rows.length === 0 ? (
                <tr><td colSpan={6} className="text-muted">No one matches.</td></tr>
              ) : (
                table.getRowModel().rows.map((r) => (
                  <tr key={r.id} data-testid="user-row" data-email={r.original.email}>
                    {r.getVisibleCells().map((c) => <td key={c.id}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
                  </tr>
                ))
              )}
            </tbody>
          </table>
        </div>
        <div className="mt-3 flex items-center gap-3 text-sm">
          <button className="btn-quiet !py-1" disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>Previous</button>
          <span>Page {table.getState().pagination.pageIndex + 1} of {Math.max(1, table.getPageCount())} · {table.getFilteredRowModel().rows.length} rows</span>
          <button className="btn-quiet !py-1" disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>Next</button>
        </div>
      </section>
    </div>
  );
}
