// Admin: the lab's two named, versioned settings — search defaults and the
// acceptance criteria that reports are evaluated against — with each one's
// version history. Saving stores a new version (PUT /api/admin/settings).
import { useEffect, useState, type FormEvent } from 'react';

interface Version { version: number; value: any; createdBy: { id: string; name: string } | null; createdAt: string }
interface Setting { name: string; version: number | null; value: any; defaults: any; history: Version[] }
type All = Record<'search-defaults' | 'acceptance-criteria', Setting>;

const RANK = [['composite', 'composite (Stein & Scott 1994)'], ['cosine', 'cosine'], ['reverseCosine', 'reverse cosine'], ['entropy', 'spectral entropy similarity']];

async function call(method: string, body?: unknown) {
  const r = await fetch('/api/admin/settings', { method, headers: { 'content-type': 'application/json', accept: 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) });
  const data = await r.json().catch(() => null);
  if (!r.ok) throw new Error(data?.error?.message ?? `The server answered ${r.status}`);
  return data;
}

function History({ s }: { s: Setting }) {
  if (s.history.length === 0) return <p className="mt-3 text-sm text-muted">Never changed: the built-in defaults apply.</p>;
  return (
    <details className="mt-3 text-sm">
      <summary className="cursor-pointer font-semibold">Version history ({s.history.length})</summary>
      <table className="data-table mt-2">
        <thead><tr><th>Version</th><th>Saved</th><th>By</th><th>Value</th></tr></thead>
        <tbody>
          {s.history.map((h) => (
            <tr key={h.version}><td>{h.version}</td><td>{h.createdAt.slice(0, 19).replace('T', ' ')} UTC</td><td>{h.createdBy?.name ?? '—'}</td><td><code className="text-xs">{JSON.stringify(h.value)}</code></td></tr>
          ))}
        </tbody>
      </table>
    </details>
  );
}

export default function ReportSettingsForm() {
  const [all, setAll] = useState<All | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [crit, setCrit] = useState<Record<string, string>>({});
  const [search, setSearch] = useState<Record<string, string>>({});
  const [reason, setReason] = useState('');

  function load(data: { settings: All }) {
    setAll(data.settings);
    const c = data.settings['acceptance-criteria'].value;
    setCrit({ minimumScore: String(c.minimumScore), riWindow: String(c.riWindow), keyIonCount: String(c.keyIonCount), keyIonTolerance: String(Math.round(c.keyIonTolerance * 1000) / 10), isomerMargin: String(c.isomerMargin) });
    const s = data.settings['search-defaults'].value;
    setSearch({ rankBy: s.rankBy, mz: String(s.weights?.mz ?? 3), intensity: String(s.weights?.intensity ?? 0.6), limit: String(s.limit ?? 50), lowMassCutoff: s.lowMassCutoff === undefined ? '' : String(s.lowMassCutoff), excludeIons: (s.excludeIons ?? []).join(', ') });
  }

  useEffect(() => {
    call('GET').then(load, (e) => setError((e as Error).message));
  }, []);

  async function save(name: string, value: unknown) {
    setError(null);
    setSaved(null);
    try {
      const data = await call('PUT', { name, value, ...(reason.trim() ? { reason: reason.trim() } : {}) });
      load(data);
      setSaved(`Saved ${name} as version ${data.setting.version}.`);
      setReason('');
    } catch (e) {
      setError((e as Error).message);
    }
  }

  const saveCriteria = (e: FormEvent) => {
    e.preventDefault();
    void save('acceptance-criteria', {
      minimumScore: Number(crit.minimumScore), riWindow: Number(crit.riWindow), keyIonCount: Number(crit.keyIonCount),
      keyIonTolerance: Number(crit.keyIonTolerance) / 100, isomerMargin: Number(crit.isomerMargin),
    });
  };
  const saveSearch = (e: FormEvent) => {
    e.preventDefault();
    const ions = search.excludeIons.split(/[,\s]+/).filter(Boolean).map(Number);
    void save('search-defaults', {
      rankBy: search.rankBy, weights: { mz: Number(search.mz), intensity: Number(search.intensity) }, limit: Number(search.limit),
      ...(search.lowMassCutoff.trim() ? { lowMassCutoff: Number(search.lowMassCutoff) } : {}),
      ...(ions.length ? { excludeIons: ions } : {}),
    });
  };

  if (!all) return <p className="text-muted" role="status">{error ?? 'Loading the settings…'}</p>;
  const f = (set: typeof setCrit, obj: Record<string, string>, k: string) => ({ value: obj[k] ?? '', onChange: (e: { target: { value: string } }) => set({ ...obj, [k]: e.target.value }), name: k });

  return (
    <div className="grid gap-6">
      {error && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-alert">{error}</p>}
      {saved && <p role="status" className="rounded-md bg-teal-soft px-3 py-2">{saved}</p>}
      <label className="max-w-xl"><span className="label">Reason for the change (kept in the audit trail)</span><input className="field" value={reason} onChange={(e) => setReason(e.target.value)} /></label>

      <form className="card" onSubmit={saveCriteria} data-testid="criteria-form">
        <h2 className="text-lg font-bold">Acceptance criteria <span className="text-sm font-normal text-muted">version {all['acceptance-criteria'].version ?? '— (built-in defaults)'}</span></h2>
        <p className="mt-1 text-sm text-muted">Evaluated for the selected hit of every identification report. A report whose selected hit fails one cannot be concluded “identified”.</p>
        <div className="mt-3 grid gap-3 md:grid-cols-5">
          <label><span className="label">Minimum ranking score (0–1)</span><input className="field" inputMode="decimal" {...f(setCrit, crit, 'minimumScore')} /></label>
          <label><span className="label">Retention-index window (±)</span><input className="field" inputMode="decimal" {...f(setCrit, crit, 'riWindow')} /></label>
          <label><span className="label">Key ions (N most intense)</span><input className="field" inputMode="numeric" {...f(setCrit, crit, 'keyIonCount')} /></label>
          <label><span className="label">Key-ion tolerance (%)</span><input className="field" inputMode="decimal" {...f(setCrit, crit, 'keyIonTolerance')} /></label>
          <label><span className="label">Isomer margin (score)</span><input className="field" inputMode="decimal" {...f(setCrit, crit, 'isomerMargin')} /></label>
        </div>
        <button className="btn-primary mt-3" type="submit">Save as a new version</button>
        <History s={all['acceptance-criteria']} />
      </form>

      <form className="card" onSubmit={saveSearch} data-testid="search-defaults-form">
        <h2 className="text-lg font-bold">Search defaults <span className="text-sm font-normal text-muted">version {all['search-defaults'].version ?? '— (built-in defaults)'}</span></h2>
        <div className="mt-3 grid gap-3 md:grid-cols-3">
          <label><span className="label">Rank hits by</span>
            <select className="field" {...f(setSearch, search, 'rankBy')}>{RANK.map(([k, v]) => <option key={k} value={k}>{v}</option>)}</select>
          </label>
          <label><span className="label">m/z weight exponent</span><input className="field" inputMode="decimal" {...f(setSearch, search, 'mz')} /></label>
          <label><span className="label">Intensity weight exponent</span><input className="field" inputMode="decimal" {...f(setSearch, search, 'intensity')} /></label>
          <label><span className="label">Hits returned</span><input className="field" inputMode="numeric" {...f(setSearch, search, 'limit')} /></label>
          <label><span className="label">Low-mass cutoff (m/z, empty = off)</span><input className="field" inputMode="decimal" {...f(setSearch, search, 'lowMassCutoff')} /></label>
          <label><span className="label">Excluded ions (m/z, comma-separated)</span><input className="field" {...f(setSearch, search, 'excludeIons')} /></label>
        </div>
        <button className="btn-primary mt-3" type="submit">Save as a new version</button>
        <History s={all['search-defaults']} />
      </form>
    </div>
  );
}
