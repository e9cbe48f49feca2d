// The ranked hit list: every score 0..1 with three decimals under its plain
// name, the ranking score as a bar, RI difference, and flags for hits too close
// to the top to tell apart and for formulas the query's molecular ion rules out.
import { useState } from 'react';
import { checkHitFormula, closeToTop } from './hitChecks';
import { SCORE_KEYS, SCORE_LABEL, type Hit, type Interpretation, type ScoreKey } from './types';

interface Props {
  hits: Hit[];
  rankBy: ScoreKey;
  margin: number;
  interpretation: Interpretation | null;
  selected: number | null;
  onSelect: (hit: Hit) => void;
  syntheticIds: Set<number>;
  /** rows shown before "Show all" @default 15 */
  initialRows?: number;
}

export default function HitTable({ hits, rankBy, margin, interpretation, selected, onSelect, syntheticIds, initialRows = 15 }: Props) {
  const [showAll, setShowAll] = useState(false);
  const close = closeToTop(hits, margin);
  const shown = showAll ? hits : hits.slice(0, Math.max(initialRows, selected ?? 0));
  const showRi = hits.some((h) => typeof h.riDelta === 'number');
  return (
    <div className="space-y-2">
      {close.size >= 2 && (
        <p className="rounded-md border border-amber/50 bg-amber/10 px-3 py-2 text-sm" data-testid="isomer-note">
          {close.size} hits lie within {margin.toFixed(3)} of the top score. Their spectra may be too alike to tell apart (isomers often are): weigh the retention index and the molecular ion.
        </p>
      )}
      <div className="overflow-x-auto rounded-lg border border-line bg-panel">
        <table className="data-table text-sm" data-testid="hit-table">
          <thead>
            <tr>
              <th scope="col">Rank</th>
              <th scope="col">Name</th>
              <th scope="col">Formula</th>
              <th scope="col">Nominal mass</th>
              <th scope="col">IHD</th>
              <th scope="col" className="min-w-40">Ranking score ({SCORE_LABEL[rankBy]})</th>
              {SCORE_KEYS.map((k) => (
                <th key={k} scope="col" className={k === rankBy ? 'text-ink' : undefined}>{SCORE_LABEL[k]}</th>
              ))}
              {showRi && <th scope="col">RI difference</th>}
              <th scope="col"><span className="sr-only">Compare</span></th>
            </tr>
          </thead>
          <tbody>
            {shown.map((h) => {
              const checks = checkHitFormula(h, interpretation);
              const contradiction = checks.filter((c) => c.kind === 'contradiction');
              const isSelected = selected === h.rank;
              const synthetic = h.synthetic ?? syntheticIds.has(h.spectrumId);
              return (
                <tr key={`${h.spectrumId}-${h.version}`} className={isSelected ? 'bg-teal-soft' : 'hover:bg-paper'} data-testid="hit-row" data-record-id={h.spectrumId}>
                  <td className="font-semibold" data-testid="hit-rank">{h.rank}</td>
                  <td>
                    <a href={`/library/${h.spectrumId}?version=${h.version}`} className="font-semibold" data-testid="hit-name">{h.name}</a>
                    <span className="text-xs text-muted"> v{h.version}</span>
                    <div className="mt-0.5 flex flex-wrap gap-1">
                      {synthetic && <span className="badge-synthetic">synthetic demo</span>}
                      {close.has(h.rank) && (
                        <span className="badge border border-amber/50 bg-amber/10 text-amber" title={`within ${margin} of the top score`} data-testid="isomer-flag">possible isomer</span>
                      )}
                      {contradiction.length > 0 && (
                        <details data-testid="formula-flag">
                          <summary className="badge cursor-pointer border border-alert/40 bg-alert-soft text-alert">formula conflicts with M</summary>
                          <p className="mt-0.5 text-xs text-alert">{checks.map((c) => c.message).join('; ')}</p>
                        </details>
                      )}
                    </div>
                  </td>
                  <td className="font-mono">{h.formula ?? '—'}</td>
                  <td>{h.nominalMass ?? '—'}</td>
                  <td>{h.ihd ?? '—'}</td>
                  <td>
                    <div className="flex items-center gap-2">
                      <div className="h-2.5 w-24 overflow-hidden rounded bg-line/60" aria-hidden="true">
                        <div className="h-full rounded bg-teal" style={{ width: `${Math.max(0, Math.min(1, h.score)) * 100}%` }} />
                      </div>
                      <span className="font-mono">{h.score.toFixed(3)}</span>
                    </div>
                  </td>
                  {SCORE_KEYS.map((k) => (
                    <td key={k} className={`font-mono ${k === rankBy ? 'font-semibold' : ''}`}>{typeof h.scores?.[k] === 'number' ? h.scores[k].toFixed(3) : '—'}</td>
                  ))}
                  {showRi && <td className="font-mono">{typeof h.riDelta === 'number' ? `${h.riDelta > 0 ? '+' : ''}${h.riDelta.toFixed(0)}` : '—'}</td>}
                  <td>
                    <button type="button" className={isSelected ? 'btn-primary !px-3 !py-1 text-sm' : 'btn-quiet !px-3 !py-1 text-sm'} onClick={() => onSelect(h)} aria-pressed={isSelected} data-testid="compare-hit">
                      {isSelected ? 'Compared' : 'Compare'}
                    </button>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {hits.length > shown.length && (
        <button type="button" className="btn-quiet text-sm" onClick={() => setShowAll(true)} data-testid="show-all-hits">
          Show all {hits.length} hits
        </button>
      )}
      {hits.some((h) => checkHitFormula(h, interpretation).some((c) => c.kind === 'contradiction')) && (
        <p className="text-xs text-muted">
          “formula conflicts with M”: the hit's formula does not fit the molecular-ion candidate or the halogen pattern read from the query (open the flag for the reason). Where M⁺· is weak or absent the reading itself may be wrong.
        </p>
      )}
    </div>
  );
}
