// Identify: the analyst's task in order. First the query (pasted peak list,
// JCAMP-DX file or a library record) and what the spectrum itself says, then
// the ranked hits, then the comparison with the chosen hit, and the hand-over
// of the whole search to an identification report.
import { lazy, Suspense, useEffect, useMemo, useRef, useState } from 'react';
import { formatPeakList, parsePeakList, type PeakListProblem } from './identify/parsePeakList';
import { riFromLadderText } from './identify/alkaneLadder';
import { answerError, SCORE_KEYS, SCORE_LABEL, type Hit, type Interpretation, type ScoreKey, type SearchAnswer } from './identify/types';
import InterpretationPanel from './identify/InterpretationPanel';
import HitTable from './identify/HitTable';

const SpectrumOverlay = lazy(() => import('./SpectrumOverlay'));

const DEFAULTS = { rankBy: 'composite' as ScoreKey, mz: '3', intensity: '0.6', limit: '50', margin: '0.02', riWindow: '30', riPhase: 'non-polar' };

interface Filters {
  formula: string;
  elements: string;
  excludeElements: string;
  ihdMin: string;
  ihdMax: string;
  massMin: string;
  massMax: string;
  tags: string;
  riValue: string;
  riWindow: string;
  riPhase: string;
  riPenalty: string;
}

const EMPTY_FILTERS: Filters = {
  formula: '', elements: '', excludeElements: '', ihdMin: '', ihdMax: '', massMin: '', massMax: '', tags: '', riValue: '', riWindow: DEFAULTS.riWindow, riPhase: DEFAULTS.riPhase, riPenalty: '',
};

interface Advanced {
  rankBy: ScoreKey;
  mz: string;
  intensity: string;
  lowMassCutoff: string;
  excludeIons: string;
  limit: string;
  margin: string;
}

interface Snapshot {
  peaks: [number, number][];
  sourceFileName: string | null;
  filters: Record<string, unknown>;
  options: Record<string, unknown>;
  limit: number;
}

const list = (s: string) => s.split(',').map((x) => x.trim()).filter(Boolean);
const num = (s: string) => (s.trim() === '' ? undefined : Number(s));

function buildRequest(filters: Filters, adv: Advanced): { filters: Record<string, unknown>; options: Record<string, unknown>; limit: number; problems: string[] } {
  const problems: string[] = [];
  const f: Record<string, unknown> = {};
  if (filters.formula.trim()) f.formula = filters.formula.trim();
  if (list(filters.elements).length) f.elements = list(filters.elements);
  if (list(filters.excludeElements).length) f.excludeElements = list(filters.excludeElements);
  for (const key of ['ihdMin', 'ihdMax', 'massMin', 'massMax'] as const) {
    const v = num(filters[key]);
    if (v !== undefined) {
      if (Number.isNaN(v)) problems.push(`${key}: "${filters[key]}" is not a number`);
      else f[key] = v;
    }
  }
  if (list(filters.tags).length) f.tags = list(filters.tags);
  const ri = num(filters.riValue);
  if (ri !== undefined) {
    const window = num(filters.riWindow) ?? Number(DEFAULTS.riWindow);
    const penalty = num(filters.riPenalty);
    if (Number.isNaN(ri) || Number.isNaN(window)) problems.push('retention index and window must be numbers');
    else f.ri = { value: ri, window, phase: filters.riPhase.trim() || DEFAULTS.riPhase, ...(penalty !== undefined && !Number.isNaN(penalty) ? { penalty } : {}) };
  }
  const options: Record<string, unknown> = { rankBy: adv.rankBy, weights: { mz: Number(adv.mz), intensity: Number(adv.intensity) } };
  if (Number.isNaN(Number(adv.mz)) || Number.isNaN(Number(adv.intensity))) problems.push('the weighting exponents must be numbers');
  const cutoff = num(adv.lowMassCutoff);
  if (cutoff !== undefined) options.lowMassCutoff = cutoff;
  const ions = list(adv.excludeIons).map(Number);
  if (ions.some(Number.isNaN)) problems.push('ions to leave out must be m/z numbers separated by commas');
  else if (ions.length) options.excludeIons = ions;
  const limit = Math.min(500, Math.max(1, Math.round(Number(adv.limit) || 50)));
  return { filters: f, options, limit, problems };
}

export default function IdentifyView({ canReport }: { canReport: boolean }) {
  const [mode, setMode] = useState<'paste' | 'file' | 'record'>('paste');
  const [peakText, setPeakText] = useState('');
  const [problems, setProblems] = useState<PeakListProblem[]>([]);
  const [warnings, setWarnings] = useState<PeakListProblem[]>([]);
  const [sourceFileName, setSourceFileName] = useState<string | null>(null);
  const [sourceNote, setSourceNote] = useState<string | null>(null);
  const [recordIdText, setRecordIdText] = useState('');
  const [filters, setFilters] = useState<Filters>(EMPTY_FILTERS);
  const [adv, setAdv] = useState<Advanced>({ rankBy: DEFAULTS.rankBy, mz: DEFAULTS.mz, intensity: DEFAULTS.intensity, lowMassCutoff: '', excludeIons: '', limit: DEFAULTS.limit, margin: DEFAULTS.margin });
  const [ladderText, setLadderText] = useState('');
  const [ladderRt, setLadderRt] = useState('');
  const [ladderResult, setLadderResult] = useState<string | null>(null);

  const [searching, setSearching] = useState(false);
  const [searchError, setSearchError] = useState<string | null>(null);
  const [answer, setAnswer] = useState<SearchAnswer | null>(null);
  const [snapshot, setSnapshot] = useState<Snapshot | null>(null);
  const [interp, setInterp] = useState<Interpretation | null>(null);
  const [interpLoading, setInterpLoading] = useState(false);
  const [interpError, setInterpError] = useState<string | null>(null);
  const [syntheticIds, setSyntheticIds] = useState<Set<number>>(new Set());

  const [selected, setSelected] = useState<Hit | null>(null);
  const [refPeaks, setRefPeaks] = useState<[number, number][] | null>(null);
  const [refError, setRefError] = useState<string | null>(null);
  const refCache = useRef(new Map<string, [number, number][]>());
  const comparisonRef = useRef<HTMLElement>(null);

  const [reportTitle, setReportTitle] = useState('');
  const [saving, setSaving] = useState(false);
  const [saveError, setSaveError] = useState<string | null>(null);

  const margin = Number(adv.margin) >= 0 ? Number(adv.margin) : 0.02;

  // Arriving from a record ("Search with this spectrum"): load it and search at once.
  useEffect(() => {
    const p = new URLSearchParams(window.location.search);
    const id = p.get('spectrumId');
    if (id && /^\d+$/.test(id)) {
      setMode('record');
      setRecordIdText(id);
      void loadRecord(id, p.get('version'), true);
    }
  }, []);

  async function loadRecord(id: string, version: string | null, thenSearch: boolean) {
    setSearchError(null);
    try {
      const res = await fetch(`/api/spectra/${id}${version && /^\d+$/.test(version) ? `?version=${version}` : ''}`);
      if (!res.ok) {
        setSearchError(await answerError(res, `Record ${id}`));
        return;
      }
      const rec = await res.json();
      const text = formatPeakList(rec.peaks);
      setPeakText(text);
      setSourceFileName(null);
      setSourceNote(`Peaks of record ${rec.id} “${rec.compound?.name ?? rec.name}”, version ${rec.version}${rec.synthetic ? ' (synthetic demo)' : ''}.`);
      if (thenSearch) await runSearch(text, null);
    } catch {
      setSearchError('The server could not be reached.');
    }
  }

  async function onFile(file: File) {
    setSearchError(null);
    setProblems([]);
    try {
      const text = await file.text();
      const { readJcamp } = await import('../lib/spectra/readJcamp');
      const read = readJcamp(text, { fileName: file.name });
      if (!read.ok) {
        setProblems([{ line: 1, message: `${file.name}: ${read.error}` }]);
        return;
      }
      const first = read.spectra[0];
      if (!first || first.peaks.length === 0) {
        setProblems([{ line: 1, message: `${file.name} holds no peaks` }]);
        return;
      }
      setPeakText(formatPeakList(first.peaks as [number, number][]));
      setSourceFileName(file.name);
      setSourceNote(
        `Read ${first.peaks.length} peaks from ${file.name}${first.title ? ` (“${first.title}”)` : ''}${read.spectra.length > 1 ? `; the file holds ${read.spectra.length} spectra, the first is used` : ''}. Edit them below if needed.`,
      );
      setMode('paste');
    } catch (e) {
      setProblems([{ line: 1, message: `${file.name} could not be read (${(e as Error).message})` }]);
    }
  }

  async function runSearch(text = peakText, fileName = sourceFileName) {
    const parsed = parsePeakList(text);
    setProblems(parsed.errors);
    setWarnings(parsed.warnings);
    if (parsed.form === 'empty') {
      setProblems([{ line: 1, message: 'paste a peak list first (one “m/z intensity” pair a line)' }]);
      return;
    }
    if (parsed.errors.length > 0) return;
    const req = buildRequest(filters, adv);
    if (req.problems.length > 0) {
      setSearchError(`Check the filters: ${req.problems.join('; ')}.`);
      return;
    }
    setSearching(true);
    setSearchError(null);
    setSelected(null);
    setRefPeaks(null);
    setSaveError(null);
    setInterpLoading(true);
    setInterpError(null);
    const body = { peaks: parsed.peaks, filters: req.filters, options: req.options, limit: req.limit };
    const interpretation = fetch('/api/interpret', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ peaks: parsed.peaks }) })
      .then(async (res) => {
        if (!res.ok) throw new Error(await answerError(res, 'Interpretation'));
        setInterp((await res.json()) as Interpretation);
      })
      .catch((e) => {
        setInterp(null);
        setInterpError((e as Error).message === 'Failed to fetch' ? 'The server could not be reached.' : (e as Error).message);
      })
      .finally(() => setInterpLoading(false));
    try {
      const res = await fetch('/api/search', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      if (!res.ok) {
        setAnswer(null);
        setSearchError(await answerError(res, 'Search'));
        return;
      }
      const result = (await res.json()) as SearchAnswer;
      setAnswer(result);
      setSnapshot({ peaks: parsed.peaks, sourceFileName: fileName, filters: req.filters, options: req.options, limit: req.limit });
      if (!reportTitle) setReportTitle(`Identification of ${fileName ?? 'pasted spectrum'}, ${new Date().toISOString().slice(0, 10)}`);
      void lookUpSynthetic(result.hits);
    } catch {
      setSearchError('The server could not be reached.');
    } finally {
      setSearching(false);
      await interpretation;
    }
  }

  async function lookUpSynthetic(hits: Hit[]) {
    if (hits.length === 0 || hits.every((h) => typeof h.synthetic === 'boolean')) return;
    try {
      const ids = [...new Set(hits.map((h) => h.spectrumId))].slice(0, 200);
      const res = await fetch(`/api/spectra?ids=${ids.join(',')}&pageSize=200`);
      if (!res.ok) return;
      const body = await res.json();
      setSyntheticIds(new Set((body.items as { id: number; synthetic: boolean }[]).filter((i) => i.synthetic).map((i) => i.id)));
    } catch {
      /* the badge is extra information; the hit list stands without it */
    }
  }

  async function selectHit(hit: Hit) {
    setSelected(hit);
    setRefError(null);
    const key = `${hit.spectrumId}:${hit.version}`;
    const cached = refCache.current.get(key);
    window.setTimeout(() => comparisonRef.current?.scrollIntoView({ behavior: 'smooth', block: 'start' }), 50);
    if (cached) {
      setRefPeaks(cached);
      return;
    }
    setRefPeaks(null);
    try {
      const res = await fetch(`/api/spectra/${hit.spectrumId}?version=${hit.version}`);
      if (!res.ok) {
        setRefError(await answerError(res, `Record ${hit.spectrumId}`));
        return;
      }
      const rec = await res.json();
      refCache.current.set(key, rec.peaks);
      setRefPeaks(rec.peaks);
    } catch {
      setRefError('The server could not be reached.');
    }
  }

  async function saveReport() {
    if (!answer || !snapshot) return;
    setSaving(true);
    setSaveError(null);
    try {
      const res = await fetch('/api/reports', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({
          title: reportTitle.trim() || 'Identification',
          query: { peaks: snapshot.peaks, sourceFileName: snapshot.sourceFileName },
          search: { filters: snapshot.filters, options: snapshot.options, limit: snapshot.limit },
          hits: answer.hits,
          selected: selected ? { recordId: selected.spectrumId, version: selected.version } : null,
          interpretation: interp,
        }),
      });
      if (!res.ok) {
        setSaveError(res.status === 404 ? 'Reports cannot be saved yet: this server has no report service (POST /api/reports answered 404). Your search is still on screen.' : await answerError(res, 'Saving the report'));
        return;
      }
      const body = await res.json();
      const id = body?.id ?? body?.report?.id;
      if (id === undefined) {
        setSaveError('The report was saved, but the server did not say under which number; find it under Reports.');
        return;
      }
      window.location.assign(`/reports/${id}`);
    } catch {
      setSaveError('The server could not be reached; the report was not saved.');
    } finally {
      setSaving(false);
    }
  }

  function computeRi() {
    const rt = Number(ladderRt);
    if (ladderRt.trim() === '' || Number.isNaN(rt)) {
      setLadderResult('Enter the unknown’s retention time.');
      return;
    }
    const r = riFromLadderText(rt, ladderText);
    if ('error' in r) setLadderResult(r.error);
    else {
      setLadderResult(`RI ${r.ri.toFixed(0)} (van den Dool and Kratz) — filled in above.`);
      setFilters((f) => ({ ...f, riValue: r.ri.toFixed(0) }));
    }
  }

  const queryPeaks = snapshot?.peaks ?? null;
  const setF = (k: keyof Filters) => (e: React.ChangeEvent<HTMLInputElement>) => setFilters((f) => ({ ...f, [k]: e.target.value }));
  const setA = (k: keyof Advanced) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => setAdv((a) => ({ ...a, [k]: e.target.value }));
  const activeFilters = useMemo(() => Object.keys(buildRequest(filters, adv).filters).length, [filters, adv]);
  const problemId = problems.length > 0 ? 'peak-list-problems' : undefined;

  return (
    <div className="space-y-6" data-testid="identify">
      {/* 1. the query and what it says */}
      <div className="grid gap-5 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section className="card space-y-4" aria-labelledby="query-heading">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="query-heading" className="text-lg font-semibold">1 · The unknown</h2>
            <div role="tablist" aria-label="Where the query comes from" className="flex gap-1 text-sm">
              {([['paste', 'Paste peaks'], ['file', 'JCAMP-DX file'], ['record', 'Library record']] as const).map(([m, label]) => (
                <button key={m} type="button" role="tab" aria-selected={mode === m} className={`rounded-md px-3 py-1 font-semibold ${mode === m ? 'bg-ink text-white' : 'text-ink hover:bg-teal-soft'}`} onClick={() => setMode(m)}>
                  {label}
                </button>
              ))}
            </div>
          </div>

          {mode === 'file' && (
            <div>
              <label className="label" htmlFor="jcamp-file">JCAMP-DX file (.jdx, .dx)</label>
              <input id="jcamp-file" type="file" accept=".jdx,.dx,.jcamp,.txt,text/plain" className="field" onChange={(e) => e.target.files?.[0] && void onFile(e.target.files[0])} />
              <p className="mt-1 text-xs text-muted">The file is read in your browser; its first spectrum becomes the peak list below.</p>
            </div>
          )}
          {mode === 'record' && (
            <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => { e.preventDefault(); if (/^\d+$/.test(recordIdText)) void loadRecord(recordIdText, null, false); }}>
              <div>
                <label className="label" htmlFor="record-id">Record number</label>
                <input id="record-id" className="field !w-36" inputMode="numeric" value={recordIdText} onChange={(e) => setRecordIdText(e.target.value.trim())} />
              </div>
              <button type="submit" className="btn-quiet">Load its peaks</button>
              <p className="w-full text-xs text-muted">Or open a record in the Library and choose “Search with this spectrum”.</p>
            </form>
          )}

          <form
            className="space-y-4"
            onSubmit={(e) => {
              e.preventDefault();
              void runSearch();
            }}
          >
            <div>
              <label className="label" htmlFor="peak-list">Peak list</label>
              <textarea
                id="peak-list"
                name="peaks"
                className="field font-mono text-sm"
                rows={9}
                spellCheck={false}
                placeholder={'41 38\n43 100\n57 62\n…'}
                value={peakText}
                aria-invalid={problems.length > 0}
                aria-describedby={`peak-list-help${problemId ? ` ${problemId}` : ''}`}
                onChange={(e) => {
                  setPeakText(e.target.value);
                  if (problems.length) setProblems([]);
                }}
              />
              <p id="peak-list-help" className="mt-1 text-xs text-muted">
                One “m/z intensity” pair a line; or “m/z:intensity” pairs separated by spaces or commas; or CSV with a header line (e.g. <code>mz,intensity</code>). Any intensity scale.
              </p>
              {sourceNote && <p className="mt-1 text-xs text-ink-soft" data-testid="source-note">{sourceNote}</p>}
              {problems.length > 0 && (
                <ul id="peak-list-problems" role="alert" className="mt-2 space-y-0.5 rounded-md bg-alert-soft px-3 py-2 text-sm text-alert" data-testid="peak-list-errors">
                  {problems.slice(0, 8).map((p, i) => <li key={i}>Line {p.line}: {p.message}</li>)}
                  {problems.length > 8 && <li>… and {problems.length - 8} more</li>}
                </ul>
              )}
              {warnings.length > 0 && problems.length === 0 && (
                <ul className="mt-2 space-y-0.5 text-xs text-amber">
                  {warnings.slice(0, 4).map((p, i) => <li key={i}>Line {p.line}: {p.message}</li>)}
                </ul>
              )}
            </div>

            <fieldset className="space-y-3">
              <legend className="text-sm font-semibold">Narrow the search by what you know {activeFilters > 0 && <span className="font-normal text-muted">({activeFilters} set)</span>}</legend>
              <div className="grid gap-3 sm:grid-cols-3">
                <div>
                  <label className="label" htmlFor="f-formula">Formula</label>
                  <input id="f-formula" className="field font-mono" placeholder="C7H8" value={filters.formula} onChange={setF('formula')} />
                </div>
                <div>
                  <label className="label" htmlFor="f-elements">Contains elements</label>
                  <input id="f-elements" className="field" placeholder="Cl,Br" value={filters.elements} onChange={setF('elements')} />
                </div>
                <div>
                  <label className="label" htmlFor="f-exclude">Lacks elements</label>
                  <input id="f-exclude" className="field" placeholder="N,S" value={filters.excludeElements} onChange={setF('excludeElements')} />
                </div>
                <div className="grid grid-cols-2 gap-2">
                  <div>
                    <label className="label" htmlFor="f-ihdmin">IHD from</label>
                    <input id="f-ihdmin" className="field" inputMode="decimal" value={filters.ihdMin} onChange={setF('ihdMin')} />
                  </div>
                  <div>
                    <label className="label" htmlFor="f-ihdmax">IHD to</label>
                    <input id="f-ihdmax" className="field" inputMode="decimal" value={filters.ihdMax} onChange={setF('ihdMax')} />
                  </div>
                </div>
                <div className="grid grid-cols-2 gap-2">
                  <div>
                    <label className="label" htmlFor="f-massmin">Mass from</label>
                    <input id="f-massmin" className="field" inputMode="numeric" value={filters.massMin} onChange={setF('massMin')} />
                  </div>
                  <div>
                    <label className="label" htmlFor="f-massmax">Mass to</label>
                    <input id="f-massmax" className="field" inputMode="numeric" value={filters.massMax} onChange={setF('massMax')} />
                  </div>
                </div>
                <div>
                  <label className="label" htmlFor="f-tags">Tags (all of)</label>
                  <input id="f-tags" className="field" placeholder="solvent" value={filters.tags} onChange={setF('tags')} />
                </div>
              </div>
              <div className="grid gap-3 rounded-md border border-line p-3 sm:grid-cols-4">
                <p className="text-sm font-semibold sm:col-span-4">Retention-index window</p>
                <div>
                  <label className="label" htmlFor="f-ri">Unknown's RI</label>
                  <input id="f-ri" className="field" inputMode="decimal" value={filters.riValue} onChange={setF('riValue')} />
                </div>
                <div>
                  <label className="label" htmlFor="f-riwindow">± window</label>
                  <input id="f-riwindow" className="field" inputMode="decimal" value={filters.riWindow} onChange={setF('riWindow')} />
                </div>
                <div>
                  <label className="label" htmlFor="f-riphase">Phase class</label>
                  <input id="f-riphase" className="field" list="ri-phases" value={filters.riPhase} onChange={setF('riPhase')} />
                  <datalist id="ri-phases"><option value="non-polar" /><option value="semi-polar" /><option value="polar" /></datalist>
                </div>
                <div>
                  <label className="label" htmlFor="f-ripenalty">Penalty outside (0..1)</label>
                  <input id="f-ripenalty" className="field" inputMode="decimal" placeholder="none: hard filter" value={filters.riPenalty} onChange={setF('riPenalty')} />
                </div>
                <details className="sm:col-span-4">
                  <summary className="cursor-pointer text-sm text-teal">RI from an n-alkane ladder</summary>
                  <div className="mt-2 grid gap-3 sm:grid-cols-[2fr_1fr_auto] sm:items-end">
                    <div>
                      <label className="label" htmlFor="ladder">Ladder: carbon number and retention time, one a line</label>
                      <textarea id="ladder" className="field font-mono text-sm" rows={4} placeholder={'C8 4.12\nC9 5.30\nC10 6.41'} value={ladderText} onChange={(e) => setLadderText(e.target.value)} />
                    </div>
                    <div>
                      <label className="label" htmlFor="ladder-rt">Unknown's retention time</label>
                      <input id="ladder-rt" className="field" inputMode="decimal" value={ladderRt} onChange={(e) => setLadderRt(e.target.value)} />
                    </div>
                    <button type="button" className="btn-quiet" onClick={computeRi}>Compute RI</button>
                    {ladderResult && <p className="text-sm sm:col-span-3" role="status">{ladderResult}</p>}
                  </div>
                </details>
              </div>
            </fieldset>

            <details className="rounded-md border border-line p-3" data-testid="advanced">
              <summary className="cursor-pointer text-sm font-semibold">Advanced: ranking score and peak weighting</summary>
              <div className="mt-3 grid gap-3 sm:grid-cols-3">
                <div>
                  <label className="label" htmlFor="a-rankby">Rank hits by</label>
                  <select id="a-rankby" className="field" value={adv.rankBy} onChange={setA('rankBy')}>
                    {SCORE_KEYS.map((k) => <option key={k} value={k}>{SCORE_LABEL[k]}{k === DEFAULTS.rankBy ? ' (default)' : ''}</option>)}
                  </select>
                </div>
                <div>
                  <label className="label" htmlFor="a-mz">m/z exponent a (default {DEFAULTS.mz})</label>
                  <input id="a-mz" className="field" inputMode="decimal" value={adv.mz} onChange={setA('mz')} />
                </div>
                <div>
                  <label className="label" htmlFor="a-int">Intensity exponent b (default {DEFAULTS.intensity})</label>
                  <input id="a-int" className="field" inputMode="decimal" value={adv.intensity} onChange={setA('intensity')} />
                </div>
                <div>
                  <label className="label" htmlFor="a-cutoff">Ignore m/z below (default off)</label>
                  <input id="a-cutoff" className="field" inputMode="decimal" value={adv.lowMassCutoff} onChange={setA('lowMassCutoff')} />
                </div>
                <div>
                  <label className="label" htmlFor="a-exclude">Leave out ions (m/z, comma-separated)</label>
                  <input id="a-exclude" className="field" placeholder="e.g. 18,28,32" value={adv.excludeIons} onChange={setA('excludeIons')} />
                </div>
                <div className="grid grid-cols-2 gap-2">
                  <div>
                    <label className="label" htmlFor="a-limit">Hits (default {DEFAULTS.limit})</label>
                    <input id="a-limit" className="field" inputMode="numeric" value={adv.limit} onChange={setA('limit')} />
                  </div>
                  <div>
                    <label className="label" htmlFor="a-margin">Isomer margin (default {DEFAULTS.margin})</label>
                    <input id="a-margin" className="field" inputMode="decimal" value={adv.margin} onChange={setA('margin')} />
                  </div>
                </div>
                <p className="text-xs text-muted sm:col-span-3">Peaks are weighted as (m/z)<sup>a</sup> · intensity<sup>b</sup> before scoring.</p>
              </div>
            </details>

            <div className="flex flex-wrap items-center gap-3">
              <button type="submit" className="btn-primary" disabled={searching} data-testid="search-button">{searching ? 'Searching…' : 'Search'}</button>
              {answer && !searching && <span className="text-sm text-muted" aria-live="polite">{answer.searched} spectra compared in {answer.tookMs.toFixed(0)} ms</span>}
            </div>
            {searchError && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert" data-testid="search-error">{searchError}</p>}
          </form>
        </section>

        <section className="card" aria-labelledby="interp-heading">
          <h2 id="interp-heading" className="mb-3 text-lg font-semibold">What the spectrum says</h2>
          <InterpretationPanel data={interp} loading={interpLoading} error={interpError} />
        </section>
      </div>

      {/* 2. the hits */}
      <section className="space-y-3" aria-labelledby="hits-heading">
        <div className="flex flex-wrap items-baseline gap-3">
          <h2 id="hits-heading" className="text-lg font-semibold">2 · Candidates from the library</h2>
          <p className="caution flex-1 !py-2" data-testid="hit-caution">
            A hit is a candidate, not an identification: confirm it with an authentic reference standard under your laboratory's procedures. Spectra marked synthetic demo are invented and not for identification.
          </p>
        </div>
        {searching && (
          <div className="space-y-2" role="status" aria-label="Searching">
            {Array.from({ length: 5 }, (_, i) => <div key={i} className="skeleton h-9 w-full" />)}
          </div>
        )}
        {!searching && !answer && !searchError && <p className="text-sm text-muted">The ranked hits appear here after a search.</p>}
        {!searching && answer && answer.hits.length === 0 && (
          <div className="card text-center" data-testid="no-hits">
            <p className="font-semibold">{answer.searched === 0 ? 'No library spectrum passed the filters.' : 'No library spectrum resembles the query.'}</p>
            <p className="mt-1 text-sm text-muted">
              {activeFilters > 0 ? 'Loosen a filter — widen the mass, IHD or RI window, or drop a formula, element or tag — and search again.' : 'Check the peak list (m/z and intensity columns the right way round?), or lower the ignored-m/z limit under Advanced.'}
            </p>
          </div>
        )}
        {!searching && answer && answer.hits.length > 0 && (
          <HitTable hits={answer.hits} rankBy={(snapshot?.options.rankBy as ScoreKey) ?? adv.rankBy} margin={margin} interpretation={interp} selected={selected?.rank ?? null} onSelect={selectHit} syntheticIds={syntheticIds} />
        )}
      </section>

      {/* 3. the comparison and the report */}
      {answer && answer.hits.length > 0 && (
        <section ref={comparisonRef} className="card space-y-4" aria-labelledby="compare-heading" data-testid="comparison">
          <h2 id="compare-heading" className="text-lg font-semibold">3 · Query against {selected ? <span>#{selected.rank} {selected.name}</span> : 'a hit'}</h2>
          {!selected && <p className="text-sm text-muted">Choose “Compare” on a hit to see the query above and the reference below, with their difference.</p>}
          {selected && refError && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert">{refError}</p>}
          {selected && !refError && (!refPeaks || !queryPeaks) && <div className="skeleton h-[520px]" role="status">Loading the reference spectrum…</div>}
          {selected && refPeaks && queryPeaks && (
            <Suspense fallback={<div className="skeleton h-[520px]" role="status">Loading the overlay…</div>}>
              <SpectrumOverlay query={queryPeaks} reference={refPeaks} referenceName={selected.name} />
            </Suspense>
          )}
          {canReport && (
            <div className="flex flex-wrap items-end gap-3 border-t border-line pt-4">
              <div className="min-w-64 flex-1">
                <label className="label" htmlFor="report-title">Report title</label>
                <input id="report-title" className="field" value={reportTitle} onChange={(e) => setReportTitle(e.target.value)} />
              </div>
              <button type="button" className="btn-accent" disabled={saving} onClick={saveReport} data-testid="save-report">
                {saving ? 'Saving…' : 'Save as identification report'}
              </button>
              <p className="w-full text-xs text-muted">
                Saves the query, filters, options, every hit and the interpretation as they are now{selected ? `, with #${selected.rank} ${selected.name} as the chosen candidate` : ''}. You add the conclusion on the report.
              </p>
              {saveError && <p role="alert" className="w-full rounded-md bg-alert-soft px-3 py-2 text-sm text-alert" data-testid="save-error">{saveError}</p>}
            </div>
          )}
        </section>
      )}
    </div>
  );
}
