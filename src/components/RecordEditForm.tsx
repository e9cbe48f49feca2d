// The record edit form (a React island the record page embeds): identity,
// structure, retention indices, acquisition and reference-standard details,
// tags and notes. Sends only the changed fields to PATCH /api/spectra/:id and
// shows the API's field-level errors beside their fields. The formula's
// masses and IHD come live from GET /api/formula as the curator types.
import { useEffect, useMemo, useRef, useState } from 'react';

interface RetentionIndexRow { phase: string; value: string; ladder: string; column: string }

interface Fields {
  name: string;
  synonyms: string;
  formula: string;
  smiles: string;
  molfile: string;
  casRegistryNo: string;
  retentionIndices: RetentionIndexRow[];
  ionizationEnergy: string;
  massRangeMin: string;
  massRangeMax: string;
  analyzerType: string;
  sourceTemperature: string;
  instrument: string;
  method: string;
  referenceLot: string;
  referencePurity: string;
  acquiredAt: string;
  acquiredBy: string;
  derivative: string;
  parentCompound: string;
  saltForm: string;
  tags: string;
  notes: string;
}

/** The record as GET /api/spectra/:id answers it (the parts the form needs). */
export interface EditableRecord {
  id: number;
  version: number;
  status: string;
  compound: {
    name: string; synonyms: string[]; formula: string | null; smiles: string | null; molfile: string | null; casRegistryNo: string | null;
    derivative: string | null; parentCompound: string | null; saltForm: string | null;
  };
  metadata: Record<string, unknown>;
  retentionIndices: { phase: string; value: number; ladder: string | null; column: string | null }[];
  tags: string[];
}

interface Props {
  recordId: number;
  version?: number;
  record?: EditableRecord;
  /** called after a successful save; by default the page reloads */
  onSaved?: (result: { version: number; createdVersion: boolean }) => void;
}

const PHASES = ['non-polar', 'semi-polar', 'polar', 'other'];
const NUMERIC: (keyof Fields)[] = ['ionizationEnergy', 'massRangeMin', 'massRangeMax', 'sourceTemperature'];

const s = (v: unknown) => (v === null || v === undefined ? '' : String(v));

function toFields(r: EditableRecord): Fields {
  const m = r.metadata ?? {};
  return {
    name: r.compound.name, synonyms: (r.compound.synonyms ?? []).join('\n'), formula: s(r.compound.formula), smiles: s(r.compound.smiles),
    molfile: s(r.compound.molfile), casRegistryNo: s(r.compound.casRegistryNo),
    retentionIndices: (r.retentionIndices ?? []).map((x) => ({ phase: x.phase, value: String(x.value), ladder: s(x.ladder), column: s(x.column) })),
    ionizationEnergy: s(m.ionizationEnergy), massRangeMin: s(m.massRangeMin), massRangeMax: s(m.massRangeMax), analyzerType: s(m.analyzerType),
    sourceTemperature: s(m.sourceTemperature), instrument: s(m.instrument), method: s(m.method), referenceLot: s(m.referenceLot),
    referencePurity: s(m.referencePurity), acquiredAt: s(m.acquiredAt), acquiredBy: s(m.acquiredBy), derivative: s(r.compound.derivative),
    parentCompound: s(r.compound.parentCompound), saltForm: s(r.compound.saltForm), tags: (r.tags ?? []).join(', '), notes: s(m.notes),
  };
}

/** The PATCH body value of one field, as the API's schema reads it. */
function apiValue(key: keyof Fields, f: Fields): unknown {
  if (key === 'synonyms') return f.synonyms.split('\n').map((x) => x.trim()).filter(Boolean);
  if (key === 'tags') return f.tags.split(',').map((x) => x.trim()).filter(Boolean);
  if (key === 'retentionIndices') {
    return f.retentionIndices.map((r) => ({ phase: r.phase.trim(), value: r.value.trim() === '' ? NaN : Number(r.value), ladder: r.ladder.trim() || null, column: r.column.trim() || null }));
  }
  const v = (f[key] as string).trim();
  if (NUMERIC.includes(key)) return v === '' ? null : Number(v);
  if (key === 'molfile') return (f[key] as string).trim() === '' ? null : (f[key] as string);
  return v === '' ? null : v;
}

interface FormulaInfo { formula: string; nominalMass: number; monoisotopicMass: number; averageMass: number; ihd: number | null }

function useFormulaInfo(mf: string) {
  const [state, setState] = useState<{ info: FormulaInfo | null; error: string | null; busy: boolean }>({ info: null, error: null, busy: false });
  useEffect(() => {
    const text = mf.trim();
    if (!text) {
      setState({ info: null, error: null, busy: false });
      return;
    }
    const ctrl = new AbortController();
    setState((p) => ({ ...p, busy: true }));
    const timer = window.setTimeout(async () => {
      try {
        const res = await fetch(`/api/formula?mf=${encodeURIComponent(text)}`, { signal: ctrl.signal });
        const body = await res.json().catch(() => null);
        if (res.ok && body) setState({ info: body as FormulaInfo, error: null, busy: false });
        else setState({ info: null, error: body?.error?.message?.replace(/^mf: /, '') ?? `the formula could not be checked (${res.status})`, busy: false });
      } catch (e) {
        if ((e as Error).name !== 'AbortError') setState({ info: null, error: 'the formula could not be checked (server not reached)', busy: false });
      }
    }, 300);
    return () => {
      ctrl.abort();
      window.clearTimeout(timer);
    };
  }, [mf]);
  return state;
}

export default function RecordEditForm({ recordId, record: given, onSaved }: Props) {
  const [record, setRecord] = useState<EditableRecord | null>(given ?? null);
  const [loadError, setLoadError] = useState<string | null>(null);
  const [fields, setFields] = useState<Fields | null>(given ? toFields(given) : null);
  const initial = useRef<Fields | null>(given ? toFields(given) : null);
  const [reason, setReason] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [warnings, setWarnings] = useState<{ code: string; message: string }[]>([]);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    if (given) return;
    (async () => {
      try {
        const res = await fetch(`/api/spectra/${recordId}`);
        const body = await res.json();
        if (!res.ok) throw new Error(body?.error?.message ?? `the record could not be loaded (${res.status})`);
        setRecord(body);
        initial.current = toFields(body);
        setFields(toFields(body));
      } catch (e) {
        setLoadError((e as Error).message);
      }
    })();
  }, [recordId, given]);

  const formula = useFormulaInfo(fields?.formula ?? '');
  const released = record?.status === 'released';
  const changed = useMemo(() => {
    if (!fields || !initial.current) return [] as (keyof Fields)[];
    return (Object.keys(fields) as (keyof Fields)[]).filter((k) => JSON.stringify(apiValue(k, fields)) !== JSON.stringify(apiValue(k, initial.current!)));
  }, [fields]);
  const metadataChanged = changed.some((k) => k !== 'tags');

  if (loadError) return <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert">{loadError}</p>;
  if (!fields || !record) return <div className="skeleton h-40" role="status">Loading the record…</div>;

  const set = <K extends keyof Fields>(key: K, value: Fields[K]) => {
    setFields({ ...fields, [key]: value });
    if (errors[key]) setErrors(({ [key]: _drop, ...rest }) => rest);
  };

  function validateHere(): Record<string, string> {
    const e: Record<string, string> = {};
    if (!fields!.name.trim()) e.name = 'a name is required';
    for (const k of NUMERIC) {
      const v = (fields![k] as string).trim();
      if (v !== '' && !Number.isFinite(Number(v))) e[k] = 'must be a number';
    }
    const lo = Number(fields!.massRangeMin);
    const hi = Number(fields!.massRangeMax);
    if (fields!.massRangeMin.trim() && fields!.massRangeMax.trim() && lo >= hi) e.massRangeMax = 'the highest m/z must be above the lowest';
    fields!.retentionIndices.forEach((r, i) => {
      if (!r.phase.trim()) e[`retentionIndices.${i}.phase`] = 'choose the stationary-phase class';
      if (r.value.trim() === '' || !Number.isFinite(Number(r.value))) e[`retentionIndices.${i}.value`] = 'the retention index must be a number';
    });
    if (formula.error && fields!.formula.trim()) e.formula = formula.error;
    if (released && metadataChanged && !reason.trim()) e.reason = 'a released record changes only with a reason (it becomes a new draft version)';
    return e;
  }

  async function save(ev: React.FormEvent) {
    ev.preventDefault();
    setMessage(null);
    setWarnings([]);
    const local = validateHere();
    if (Object.keys(local).length > 0) {
      setErrors(local);
      setMessage({ ok: false, text: 'Some fields need attention.' });
      return;
    }
    if (changed.length === 0) {
      setMessage({ ok: true, text: 'Nothing has changed.' });
      return;
    }
    const body: Record<string, unknown> = { baseVersion: record!.version };
    for (const k of changed) body[k] = apiValue(k, fields!);
    if (reason.trim()) body.reason = reason.trim();
    setBusy(true);
    try {
      const res = await fetch(`/api/spectra/${recordId}`, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      const answer = await res.json().catch(() => null);
      if (!res.ok) {
        const fieldErrors: Record<string, string> = {};
        for (const d of (answer?.error?.details ?? []) as { field: string; message: string }[]) if (d.field) fieldErrors[d.field] = d.message;
        setErrors(fieldErrors);
        setMessage({ ok: false, text: answer?.error?.message ?? `The server answered ${res.status}.` });
        return;
      }
      setWarnings(answer.warnings ?? []);
      initial.current = fields;
      setReason('');
      setMessage({ ok: true, text: answer.createdVersion ? `Saved as version ${answer.version}, a new draft; version ${record!.version} stays released until it is approved.` : `Saved (version ${answer.version}, ${answer.status.replace('_', ' ')}).` });
      if (onSaved) onSaved({ version: answer.version, createdVersion: answer.createdVersion });
      else window.setTimeout(() => window.location.assign(`/library/${recordId}${answer.createdVersion ? `?version=${answer.version}` : ''}`), (answer.warnings ?? []).length ? 2500 : 900);
    } catch {
      setMessage({ ok: false, text: 'The server could not be reached.' });
    } finally {
      setBusy(false);
    }
  }

  const err = (key: string) => errors[key] ? <p id={`err-${key}`} className="mt-1 text-sm text-alert" data-testid={`error-${key}`}>{errors[key]}</p> : null;
  const text = (key: keyof Fields, label: string, opts: { hint?: string; type?: string; mono?: boolean; placeholder?: string } = {}) => (
    <div>
      <label className="label" htmlFor={`edit-${key}`}>{label}</label>
      <input
        id={`edit-${key}`} name={key} type={opts.type ?? 'text'} inputMode={NUMERIC.includes(key) ? 'decimal' : undefined}
        className={`field ${opts.mono ? 'font-mono' : ''} ${errors[key] ? 'border-alert' : ''}`} value={fields[key] as string} placeholder={opts.placeholder}
        aria-invalid={!!errors[key]} aria-describedby={errors[key] ? `err-${key}` : undefined}
        onChange={(e) => set(key, e.target.value as never)}
      />
      {opts.hint && !errors[key] && <p className="mt-1 text-xs text-muted">{opts.hint}</p>}
      {err(key)}
    </div>
  );

  return (
    <form onSubmit={save} className="space-y-5" data-testid="record-edit-form" noValidate>
      {released && <p className="caution">This version is released. Saving a change makes version {record.version + 1} as a draft; version {record.version} stays released and searchable until the new one is approved. Tags change without a new version.</p>}

      <fieldset className="grid gap-4 md:grid-cols-2">
        <legend className="mb-2 text-base font-semibold">Compound</legend>
        {text('name', 'Name')}
        <div>
          <label className="label" htmlFor="edit-synonyms">Synonyms <span className="font-normal text-muted">(one a line)</span></label>
          <textarea id="edit-synonyms" className="field h-20" value={fields.synonyms} onChange={(e) => set('synonyms', e.target.value)} />
          {err('synonyms')}
        </div>
        <div>
          {text('formula', 'Molecular formula', { mono: true, placeholder: 'e.g. C7H7Cl' })}
          <p className="mt-1 text-sm" aria-live="polite" data-testid="formula-info">
            {formula.busy && <span className="text-muted">checking…</span>}
            {!formula.busy && formula.info && (
              <span className="text-ink-soft">
                <span className="font-mono">{formula.info.formula}</span> · nominal {formula.info.nominalMass} · monoisotopic {formula.info.monoisotopicMass.toFixed(4)} · average {formula.info.averageMass.toFixed(3)} · IHD {formula.info.ihd ?? '–'}
              </span>
            )}
            {!formula.busy && formula.error && !errors.formula && <span className="text-alert">{formula.error}</span>}
          </p>
        </div>
        {text('casRegistryNo', 'Registry number (CAS RN)', { mono: true, placeholder: 'NNNNNNN-NN-N' })}
        {text('smiles', 'SMILES', { mono: true, hint: 'or paste a molfile below; the structure is checked against the formula' })}
        <div>
          <label className="label" htmlFor="edit-molfile">Molfile</label>
          <textarea id="edit-molfile" className={`field h-20 font-mono text-xs ${errors.molfile ? 'border-alert' : ''}`} value={fields.molfile} onChange={(e) => set('molfile', e.target.value)} aria-invalid={!!errors.molfile} />
          {err('molfile')}
        </div>
        {text('derivative', 'Derivative', { placeholder: 'e.g. TMS derivative' })}
        {text('parentCompound', 'Parent compound (of a derivative)')}
        {text('saltForm', 'Salt form', { hint: 'the salt beside the measured free base, e.g. hydrochloride' })}
      </fieldset>

      <fieldset>
        <legend className="mb-2 text-base font-semibold">Retention indices</legend>
        <div className="space-y-2">
          {fields.retentionIndices.map((r, i) => (
            <div key={i} className="grid items-start gap-2 md:grid-cols-[10rem_8rem_1fr_1fr_auto]" data-testid="ri-row">
              <div>
                <label className="sr-only" htmlFor={`ri-phase-${i}`}>Stationary-phase class</label>
                <select id={`ri-phase-${i}`} className="field" value={r.phase} onChange={(e) => set('retentionIndices', fields.retentionIndices.map((x, k) => (k === i ? { ...x, phase: e.target.value } : x)))}>
                  <option value="">phase class…</option>
                  {[...new Set([...PHASES, r.phase].filter(Boolean))].map((p) => <option key={p} value={p}>{p}</option>)}
                </select>
                {err(`retentionIndices.${i}.phase`)}
              </div>
              <div>
                <label className="sr-only" htmlFor={`ri-value-${i}`}>Retention index</label>
                <input id={`ri-value-${i}`} className="field font-mono" inputMode="decimal" placeholder="RI" value={r.value} onChange={(e) => set('retentionIndices', fields.retentionIndices.map((x, k) => (k === i ? { ...x, value: e.target.value } : x)))} />
                {err(`retentionIndices.${i}.value`)}
              </div>
              <input aria-label="Alkane ladder" className="field" placeholder="alkane ladder, e.g. C8–C20" value={r.ladder} onChange={(e) => set('retentionIndices', fields.retentionIndices.map((x, k) => (k === i ? { ...x, ladder: e.target.value } : x)))} />
              <input aria-label="Column" className="field" placeholder="column" value={r.column} onChange={(e) => set('retentionIndices', fields.retentionIndices.map((x, k) => (k === i ? { ...x, column: e.target.value } : x)))} />
              <button type="button" className="btn-quiet" onClick={() => set('retentionIndices', fields.retentionIndices.filter((_, k) => k !== i))}>Remove</button>
            </div>
          ))}
          <button type="button" className="btn-quiet" onClick={() => set('retentionIndices', [...fields.retentionIndices, { phase: '', value: '', ladder: '', column: '' }])}>Add a retention index</button>
        </div>
      </fieldset>

      <fieldset className="grid gap-4 md:grid-cols-3">
        <legend className="mb-2 text-base font-semibold">Acquisition</legend>
        {text('ionizationEnergy', 'Ionization energy (eV)', { placeholder: '70' })}
        {text('massRangeMin', 'Mass range from (m/z)')}
        {text('massRangeMax', 'Mass range to (m/z)')}
        {text('analyzerType', 'Analyser type', { placeholder: 'e.g. quadrupole, ion trap, TOF' })}
        {text('sourceTemperature', 'Source temperature (°C)')}
        {text('instrument', 'Instrument')}
        {text('method', 'Method')}
        {text('acquiredAt', 'Acquisition date', { placeholder: 'YYYY-MM-DD' })}
        {text('acquiredBy', 'Analyst')}
      </fieldset>

      <fieldset className="grid gap-4 md:grid-cols-2">
        <legend className="mb-2 text-base font-semibold">Reference standard</legend>
        {text('referenceLot', 'Lot')}
        {text('referencePurity', 'Purity', { placeholder: 'e.g. 99.5 % (GC)' })}
      </fieldset>

      <fieldset className="grid gap-4 md:grid-cols-2">
        <legend className="mb-2 text-base font-semibold">Tags and notes</legend>
        {text('tags', 'Tags', { hint: 'comma separated; new names become new tags' })}
        <div>
          <label className="label" htmlFor="edit-notes">Notes</label>
          <textarea id="edit-notes" className="field h-24" value={fields.notes} onChange={(e) => set('notes', e.target.value)} />
          {err('notes')}
        </div>
      </fieldset>

      {(released || record.status === 'draft') && (
        <div>
          <label className="label" htmlFor="edit-reason">Reason for the change {released && metadataChanged ? <span className="text-alert">(required)</span> : <span className="font-normal text-muted">(optional)</span>}</label>
          <input id="edit-reason" className={`field ${errors.reason ? 'border-alert' : ''}`} value={reason} onChange={(e) => { setReason(e.target.value); if (errors.reason) setErrors(({ reason: _r, ...rest }) => rest); }} aria-invalid={!!errors.reason} />
          {err('reason')}
        </div>
      )}

      {message && <p role={message.ok ? 'status' : 'alert'} className={`rounded-md px-3 py-2 text-sm ${message.ok ? 'bg-teal-soft text-ink' : 'bg-alert-soft text-alert'}`} data-testid="edit-message">{message.text}</p>}
      {warnings.length > 0 && (
        <ul className="caution list-disc pl-8" data-testid="edit-warnings">
          {warnings.map((w, i) => <li key={i}><span className="font-mono text-xs">{w.code}</span> {w.message}</li>)}
        </ul>
      )}
      <div className="flex items-center gap-3">
        <button type="submit" className="btn-primary" disabled={busy}>{busy ? 'Saving…' : released && metadataChanged ? 'Save as a new draft version' : 'Save'}</button>
        <span className="text-sm text-muted">{changed.length === 0 ? 'no changes' : `${changed.length} field${changed.length === 1 ? '' : 's'} changed`}</span>
      </div>
    </form>
  );
}
