// The import screen's island: drop many JCAMP-DX files (or choose them), each
// uploads in its own request, a few at a time, with a progress bar fed by the
// browser's upload progress, then "processing" until its report arrives. The
// report table offers the actions a file may need: store a file whose peaks
// are already in the library under another compound, choose the pages of a
// long run, submit the new drafts for review.
import { useCallback, useRef, useState } from 'react';

interface Warning { code: string; message: string }
interface Found { index: number; page: number | null; title: string; name: string; formula: string | null; peakCount: number; retentionTime: number | null; outcome: string; dataForm: string }
interface Report {
  file: string;
  status: 'imported' | 'duplicate' | 'rejected' | 'needs_selection' | 'needs_confirmation';
  spectra: { id: number; version: number; name: string; page: number | null }[];
  duplicateOf?: number;
  warnings: Warning[];
  error?: string;
  found: Found[];
  fieldsRead: string[];
  pageCount: number;
  samePeaksAs?: { id: number; version: number; name: string }[];
}

type Phase = 'waiting' | 'uploading' | 'processing' | 'done' | 'failed';

interface Item {
  key: string;
  file: File;
  dropBatch: string;
  phase: Phase;
  upload: number;
  report: Report | null;
  batchId: string | null;
  problem: string | null;
  submitted: Record<number, 'sending' | 'done' | string>;
  selecting: number[] | null;
  busy: boolean;
}

const PARALLEL = 3;

const STATUS_TEXT: Record<Report['status'], string> = {
  imported: 'imported',
  duplicate: 'already in the library',
  rejected: 'rejected',
  needs_selection: 'choose pages',
  needs_confirmation: 'needs your confirmation',
};
const STATUS_TONE: Record<Report['status'], string> = {
  imported: 'bg-teal-soft text-ink border-teal/40',
  duplicate: 'bg-paper text-ink-soft border-line',
  rejected: 'bg-alert-soft text-alert border-alert/40',
  needs_selection: 'bg-copper-soft text-copper border-copper/40',
  needs_confirmation: 'bg-copper-soft text-copper border-copper/40',
};

function kb(n: number) {
  return n < 1024 ? `${n} B` : n < 1048576 ? `${(n / 1024).toFixed(1)} KB` : `${(n / 1048576).toFixed(1)} MB`;
}

function errorText(status: number, body: any): string {
  return body?.error?.message ?? (status === 413 ? 'The upload is over a size limit.' : `The server answered ${status}.`);
}

/** A version-4 UUID; crypto.randomUUID needs a secure context, getRandomValues does not. */
function newBatchId(): string {
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6] & 0x0f) | 0x40;
  b[8] = (b[8] & 0x3f) | 0x80;
  const h = [...b].map((x) => x.toString(16).padStart(2, '0')).join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

/** One file, one request: XMLHttpRequest for its upload progress events. The files of one drop share a batch. */
function upload(file: File, batchId: string, onProgress: (fraction: number) => void, onUploaded: () => void): Promise<{ status: number; body: any }> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/imports');
    xhr.responseType = 'json';
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.upload.onload = () => {
      onProgress(1);
      onUploaded();
    };
    xhr.onload = () => resolve({ status: xhr.status, body: xhr.response });
    xhr.onerror = () => resolve({ status: 0, body: null });
    const form = new FormData();
    form.append('batchId', batchId);
    form.append('files', file, file.name);
    xhr.send(form);
  });
}

export default function ImportPanel({ maxFileMb = 25 }: { maxFileMb?: number }) {
  const [items, setItems] = useState<Item[]>([]);
  const [dragging, setDragging] = useState(false);
  const queue = useRef<string[]>([]);
  const running = useRef(0);
  const inputRef = useRef<HTMLInputElement>(null);
  const itemsRef = useRef<Item[]>([]);
  itemsRef.current = items;

  const patch = useCallback((key: string, change: Partial<Item> | ((it: Item) => Partial<Item>)) => {
    setItems((list) => list.map((it) => (it.key === key ? { ...it, ...(typeof change === 'function' ? change(it) : change) } : it)));
  }, []);

  const pump = useCallback(() => {
    while (running.current < PARALLEL && queue.current.length > 0) {
      const key = queue.current.shift()!;
      const item = itemsRef.current.find((i) => i.key === key);
      if (!item) continue;
      running.current++;
      patch(key, { phase: 'uploading', upload: 0 });
      void upload(
        item.file,
        item.dropBatch,
        (fraction) => patch(key, { upload: Math.round(fraction * 100) }),
        () => patch(key, { phase: 'processing', upload: 100 }),
      ).then(({ status, body }) => {
        running.current--;
        if (status === 200 && body?.files?.[0]) patch(key, { phase: 'done', upload: 100, report: body.files[0], batchId: body.batchId });
        else patch(key, { phase: 'failed', problem: status === 0 ? 'The server could not be reached.' : errorText(status, body) });
        pump();
      });
    }
  }, [patch]);

  function addFiles(list: FileList | File[]) {
    const files = [...list];
    const dropBatch = newBatchId();
    const fresh: Item[] = files.map((file, i) => ({
      key: `${Date.now()}-${i}-${file.name}`, file, dropBatch, phase: 'waiting', upload: 0, report: null, batchId: null,
      problem: file.size > maxFileMb * 1048576 ? `over the size limit of ${maxFileMb} MB` : null, submitted: {}, selecting: null, busy: false,
    }));
    const accepted = fresh.map((it) => (it.problem ? { ...it, phase: 'failed' as Phase } : it));
    itemsRef.current = [...itemsRef.current, ...accepted];
    setItems(itemsRef.current);
    queue.current.push(...accepted.filter((it) => it.phase === 'waiting').map((it) => it.key));
    pump();
  }

  async function confirm(item: Item, pages?: number[] | 'all') {
    if (!item.batchId || !item.report) return;
    patch(item.key, { busy: true, problem: null });
    try {
      const res = await fetch(`/api/imports/${item.batchId}/confirm`, {
        method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ file: item.report.file, ...(pages ? { pages } : {}) }),
      });
      const body = await res.json().catch(() => null);
      if (res.ok) patch(item.key, { report: body, selecting: null, busy: false });
      else patch(item.key, { busy: false, problem: errorText(res.status, body) });
    } catch {
      patch(item.key, { busy: false, problem: 'The server could not be reached.' });
    }
  }

  async function submitForReview(item: Item, recordId: number) {
    patch(item.key, (it) => ({ submitted: { ...it.submitted, [recordId]: 'sending' } }));
    try {
      const res = await fetch(`/api/spectra/${recordId}/review`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ action: 'submit' }) });
      const body = await res.json().catch(() => null);
      patch(item.key, (it) => ({ submitted: { ...it.submitted, [recordId]: res.ok ? 'done' : errorText(res.status, body) } }));
    } catch {
      patch(item.key, (it) => ({ submitted: { ...it.submitted, [recordId]: 'The server could not be reached.' } }));
    }
  }

  const openDrafts = items.flatMap((it) => (it.report?.status === 'imported' ? it.report.spectra.filter((s) => it.submitted[s.id] !== 'done' && it.submitted[s.id] !== 'sending').map((s) => ({ it, id: s.id })) : []));
  const finished = items.filter((it) => it.phase === 'done' || it.phase === 'failed').length;

  return (
    <div className="space-y-5">
      <div
        role="button"
        tabIndex={0}
        aria-label="Drop JCAMP-DX files here, or press Enter to choose files"
        data-testid="drop-zone"
        className={`flex min-h-40 cursor-pointer flex-col items-center justify-center rounded-lg border-2 border-dashed p-8 text-center transition-colors ${dragging ? 'border-teal bg-teal-soft' : 'border-line bg-panel hover:border-teal'}`}
        onClick={() => inputRef.current?.click()}
        onKeyDown={(e) => { if (e.key === 'Enter' || e.key === ' ') { e.preventDefault(); inputRef.current?.click(); } }}
        onDragOver={(e) => { e.preventDefault(); setDragging(true); }}
        onDragLeave={() => setDragging(false)}
        onDrop={(e) => { e.preventDefault(); setDragging(false); if (e.dataTransfer.files.length) addFiles(e.dataTransfer.files); }}
      >
        <p className="text-lg font-semibold">Drop JCAMP-DX files here</p>
        <p className="text-sm text-muted">or click to choose them · peak tables, XYDATA (AFFN, PAC, SQZ, DIF, DUP), LINK compound files, NTUPLES runs · up to {maxFileMb} MB a file</p>
        <input ref={inputRef} type="file" multiple className="sr-only" data-testid="file-input" onChange={(e) => { if (e.target.files?.length) addFiles(e.target.files); e.target.value = ''; }} />
      </div>

      {items.length > 0 && (
        <section className="card" aria-label="Files">
          <div className="mb-3 flex flex-wrap items-center gap-3">
            <h2 className="text-lg font-semibold">Files</h2>
            <span className="text-sm text-muted" data-testid="import-summary">{finished} of {items.length} done</span>
            {openDrafts.length > 0 && (
              <button type="button" className="btn-primary ml-auto" data-testid="submit-all" onClick={() => { for (const d of openDrafts) void submitForReview(d.it, d.id); }}>
                Submit {openDrafts.length} new draft{openDrafts.length === 1 ? '' : 's'} for review
              </button>
            )}
          </div>
          <ul className="space-y-2" data-testid="upload-list">
            {items.map((it) => (
              <li key={it.key} className="grid items-center gap-3 md:grid-cols-[minmax(0,1fr)_16rem_10rem]" data-testid="upload-row" data-file={it.file.name} data-phase={it.phase}>
                <span className="truncate font-mono text-sm" title={it.file.name}>{it.file.name} <span className="text-muted">({kb(it.file.size)})</span></span>
                <progress
                  className="h-3 w-full accent-teal"
                  max={100}
                  value={it.phase === 'done' || it.phase === 'processing' ? 100 : it.upload}
                  aria-label={`Upload of ${it.file.name}`}
                  data-testid="upload-progress"
                  data-complete={it.phase === 'done' ? 'true' : 'false'}
                />
                <span className="text-sm" aria-live="polite">
                  {it.phase === 'waiting' && 'waiting'}
                  {it.phase === 'uploading' && `uploading ${it.upload} %`}
                  {it.phase === 'processing' && 'processing…'}
                  {it.phase === 'done' && it.report && STATUS_TEXT[it.report.status]}
                  {it.phase === 'failed' && <span className="text-alert">not sent</span>}
                </span>
              </li>
            ))}
          </ul>
        </section>
      )}

      {items.some((it) => it.report || it.problem) && (
        <section className="card overflow-x-auto" aria-label="Import report">
          <h2 className="mb-3 text-lg font-semibold">Report</h2>
          <table className="data-table text-sm" data-testid="report-table">
            <thead>
              <tr><th scope="col">File</th><th scope="col">Result</th><th scope="col">Spectra</th><th scope="col">What was read</th><th scope="col">Warnings</th><th scope="col">Action</th></tr>
            </thead>
            <tbody>
              {items.filter((it) => it.report || it.problem).map((it) => {
                const r = it.report;
                return (
                  <tr key={it.key} data-testid="report-row" data-file={it.file.name} data-status={r?.status ?? 'failed'} data-batch={it.batchId ?? ''}>
                    <td className="font-mono">{it.file.name}</td>
                    <td>
                      {r ? <span className={`badge border ${STATUS_TONE[r.status]}`} data-testid="report-status">{STATUS_TEXT[r.status]}</span> : <span className="badge border bg-alert-soft text-alert">not sent</span>}
                      {r?.error && <p className="mt-1 text-alert" data-testid="report-error">{r.error}</p>}
                      {it.problem && <p className="mt-1 text-alert" role="alert">{it.problem}</p>}
                      {r?.status === 'duplicate' && r.duplicateOf && <p className="mt-1">same compound and peaks as <a href={`/library/${r.duplicateOf}`}>record {r.duplicateOf}</a>; not stored again</p>}
                    </td>
                    <td>
                      {r && r.spectra.length > 0 && (
                        <ul className="space-y-1">
                          {r.spectra.map((s) => (
                            <li key={s.id}>
                              <a href={`/library/${s.id}`} data-testid="record-link">{s.name}</a>{s.page !== null && <span className="text-muted"> · page {s.page}</span>} <span className="text-muted">(record {s.id}, draft)</span>
                              {it.submitted[s.id] === 'done' ? <span className="ml-2 text-moss" data-testid="submitted">submitted for review</span>
                                : it.submitted[s.id] === 'sending' ? <span className="ml-2 text-muted">submitting…</span>
                                : <>
                                    <button type="button" className="btn-quiet ml-2 !px-2 !py-0.5 text-xs" onClick={() => void submitForReview(it, s.id)}>Submit for review</button>
                                    {it.submitted[s.id] && <span className="ml-2 text-alert">{it.submitted[s.id]}</span>}
                                  </>}
                            </li>
                          ))}
                        </ul>
                      )}
                      {r && r.spectra.length === 0 && r.found.length > 0 && <span className="text-muted">{r.found.length} found, none stored</span>}
                    </td>
                    <td className="text-xs text-muted">
                      {r && r.found.length > 0 && <p>{r.found.length} spectrum{r.found.length === 1 ? '' : 's'} · {[...new Set(r.found.map((f) => f.dataForm))].join(', ')}{r.pageCount > 0 ? ` · ${r.pageCount} pages` : ''}</p>}
                      {r && r.fieldsRead.length > 0 && <p className="mt-1">{r.fieldsRead.join(', ')}</p>}
                    </td>
                    <td>
                      {r && r.warnings.length > 0 && (
                        <ul className="space-y-1" data-testid="report-warnings">
                          {r.warnings.map((w, i) => <li key={i}><span className="font-mono text-xs text-copper">{w.code}</span> {w.message}</li>)}
                        </ul>
                      )}
                    </td>
                    <td>
                      {r?.status === 'needs_confirmation' && (
                        <div className="space-y-1">
                          <p>Peaks already in {r.samePeaksAs?.map((s, i) => <span key={s.id}>{i > 0 && ', '}<a href={`/library/${s.id}`}>{s.name}</a></span>)}: a mislabelled file?</p>
                          <button type="button" className="btn-quiet" disabled={it.busy} data-testid="confirm-store" onClick={() => void confirm(it)}>Store it anyway</button>
                        </div>
                      )}
                      {r?.status === 'needs_selection' && (
                        it.selecting === null ? (
                          <div className="flex flex-wrap gap-2">
                            <button type="button" className="btn-quiet" onClick={() => patch(it.key, { selecting: [] })}>Choose pages…</button>
                            <button type="button" className="btn-quiet" disabled={it.busy} onClick={() => void confirm(it, 'all')}>Import all {r.pageCount}</button>
                          </div>
                        ) : (
                          <div className="space-y-2" data-testid="page-picker">
                            <div className="max-h-56 overflow-auto rounded border border-line p-2">
                              {r.found.filter((f) => f.page !== null).map((f) => (
                                <label key={f.page} className="flex items-center gap-2 text-xs">
                                  <input type="checkbox" checked={it.selecting!.includes(f.page!)} onChange={(e) => patch(it.key, (cur) => ({ selecting: e.target.checked ? [...(cur.selecting ?? []), f.page!] : (cur.selecting ?? []).filter((p) => p !== f.page) }))} />
                                  page {f.page}{f.retentionTime !== null ? ` · RT ${f.retentionTime}` : ''} · {f.peakCount} peaks
                                </label>
                              ))}
                            </div>
                            <button type="button" className="btn-primary" disabled={it.busy || it.selecting!.length === 0} onClick={() => void confirm(it, [...it.selecting!].sort((a, b) => a - b))}>
                              Import {it.selecting!.length} page{it.selecting!.length === 1 ? '' : 's'}
                            </button>
                          </div>
                        )
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </section>
      )}
    </div>
  );
}
