// What the query spectrum itself says (/api/interpret): molecular-ion
// candidate, isotope clusters and halogens, nitrogen rule, candidate formulas,
// losses from M and common fragment ions. Every line is a candidate reading.
import type { Interpretation } from './types';

function nitrogenText(n: Interpretation['nitrogenRule']): string | null {
  if (!n) return null;
  if (typeof n === 'string') return n;
  if (n.note) return n.note;
  if (n.nominalMass !== undefined) return `M = ${n.nominalMass} is ${n.parity}: nitrogen count ${n.nitrogen}.`;
  return null;
}

export default function InterpretationPanel({ data, loading, error }: { data: Interpretation | null; loading: boolean; error: string | null }) {
  if (loading) {
    return (
      <div className="space-y-2" role="status" aria-label="Reading the spectrum">
        <div className="skeleton h-6 w-2/3" />
        <div className="skeleton h-4 w-full" />
        <div className="skeleton h-4 w-5/6" />
        <div className="skeleton h-24 w-full" />
      </div>
    );
  }
  if (error) return <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert" data-testid="interpretation-error">{error}</p>;
  if (!data) return <p className="text-sm text-muted">Run a search: the spectrum's molecular ion, isotope clusters, nitrogen rule and candidate formulas appear here.</p>;
  const m = data.molecularIon;
  const h = data.halogenEstimate;
  const n = nitrogenText(data.nitrogenRule);
  return (
    <div className="space-y-4 text-sm" data-testid="interpretation">
      <div data-testid="molecular-ion">
        <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-soft">Molecular ion</h3>
        {m ? (
          <>
            <p className="text-xl font-bold">m/z {m.mz} <span className="text-sm font-normal text-muted">confidence {m.confidence.toFixed(2)}</span></p>
            {m.reasons?.length > 0 && (
              <ul className="mt-1 list-disc pl-5 text-muted">
                {m.reasons.map((r, i) => <li key={i}>{r}</li>)}
              </ul>
            )}
          </>
        ) : (
          <p className="text-muted">No convincing molecular-ion candidate: M⁺· may be absent, as it often is for alcohols, branched alkanes and many esters.</p>
        )}
      </div>
      {(h || n) && (
        <div className="grid gap-3 sm:grid-cols-2">
          {h && (
            <div>
              <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-soft">Halogens at M</h3>
              <p><strong>Cl {h.Cl}, Br {h.Br}</strong> <span className="text-muted">(residual {h.fit.toFixed(3)})</span></p>
              {h.alternatives?.length > 0 && <p className="text-muted">also close: {h.alternatives.map((a) => `Cl ${a.Cl} Br ${a.Br} (${a.fit.toFixed(3)})`).join('; ')}</p>}
            </div>
          )}
          {n && (
            <div>
              <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-soft">Nitrogen rule</h3>
              <p>{n}</p>
            </div>
          )}
        </div>
      )}
      {data.candidateFormulas.length > 0 && (
        <div>
          <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-soft">Candidate formulas</h3>
          <table className="data-table mt-1 text-sm" data-testid="candidate-formulas">
            <thead><tr><th scope="col">Formula</th><th scope="col">IHD</th><th scope="col">Isotope fit (0 = perfect)</th></tr></thead>
            <tbody>
              {data.candidateFormulas.slice(0, 8).map((c) => (
                <tr key={c.formula}><td className="font-mono">{c.formula}</td><td>{c.ihd}</td><td>{c.isotopeFit === null ? '—' : c.isotopeFit.toFixed(3)}</td></tr>
              ))}
            </tbody>
          </table>
          {data.candidateFormulas.length > 8 && <p className="mt-1 text-xs text-muted">{data.candidateFormulas.length - 8} more not shown.</p>}
        </div>
      )}
      {data.isotopeClusters.length > 0 && (
        <div>
          <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-soft">Isotope clusters</h3>
          <ul className="mt-1 space-y-0.5">
            {data.isotopeClusters.slice(0, 5).map((c) => (
              <li key={c.mz}>
                m/z {c.mz}
                {c.members && c.members.length > 1 && <span className="text-muted"> ({c.members.map((x) => `${x.mz}: ${x.relative.toFixed(0)}`).join(', ')})</span>}
                {c.halogens && (c.halogens.Cl > 0 || c.halogens.Br > 0) && <span> · Cl {c.halogens.Cl} Br {c.halogens.Br}</span>}
              </li>
            ))}
          </ul>
        </div>
      )}
      {data.losses.length > 0 && (
        <div>
          <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-soft">Losses from M</h3>
          <ul className="mt-1 flex flex-wrap gap-1.5" data-testid="losses">
            {data.losses.slice(0, 10).map((l) => (
              <li key={`${l.fromMz}-${l.toMz}`} className="rounded border border-copper/40 bg-copper-soft px-1.5 py-0.5">
                {l.fromMz} → {l.toMz}: −{l.loss} {l.composition}
              </li>
            ))}
          </ul>
        </div>
      )}
      {data.fragments.length > 0 && (
        <div>
          <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-soft">Common fragment ions</h3>
          <ul className="mt-1 flex flex-wrap gap-1.5">
            {data.fragments.slice(0, 10).map((f) => (
              <li key={f.mz} className="rounded border border-teal/40 bg-teal-soft px-1.5 py-0.5">m/z {f.mz}: {f.composition}</li>
            ))}
          </ul>
        </div>
      )}
      <p className="text-xs text-muted">Readings of the spectrum alone, to weigh against the hits; none of them is an identification.</p>
    </div>
  );
}
