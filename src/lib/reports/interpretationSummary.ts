// The interpretation saved with a report, reduced to a few plain lines for the
// report page and the print view. Tolerant of missing parts: the snapshot
// holds whatever the Identify view had when the report was saved.
type Any = Record<string, any>;

const n = (x: unknown, d = 1) => (typeof x === 'number' && Number.isFinite(x) ? x.toFixed(d) : null);

export function interpretationSummary(interp: unknown): { label: string; value: string }[] {
  if (interp === null || interp === undefined) return [];
  if (typeof interp === 'string') return interp.trim() ? [{ label: 'Summary', value: interp.trim() }] : [];
  if (typeof interp !== 'object') return [];
  const i = interp as Any;
  const out: { label: string; value: string }[] = [];
  if (typeof i.summary === 'string' && i.summary.trim()) out.push({ label: 'Summary', value: i.summary.trim() });
  if ('molecularIon' in i) {
    const m = i.molecularIon as Any | null;
    out.push({ label: 'Molecular ion', value: m && typeof m.mz === 'number' ? `m/z ${n(m.mz, 0)}${m.confidence !== undefined ? ` (confidence ${n(m.confidence, 2)})` : ''}` : 'none found' });
  }
  const h = i.halogenEstimate as Any | null | undefined;
  if (h && (typeof h.Cl === 'number' || typeof h.Br === 'number')) {
    out.push({ label: 'Halogens from the isotope cluster', value: `Cl ${h.Cl ?? 0}, Br ${h.Br ?? 0}${h.fit !== undefined ? ` (fit ${n(h.fit, 4)})` : ''}` });
  }
  const nr = i.nitrogenRule;
  if (nr) out.push({ label: 'Nitrogen rule', value: typeof nr === 'string' ? nr : [nr.note, nr.parity, nr.nitrogen].filter(Boolean).join('; ') || JSON.stringify(nr) });
  if (Array.isArray(i.candidateFormulas) && i.candidateFormulas.length) {
    out.push({ label: 'Candidate formulas', value: i.candidateFormulas.slice(0, 5).map((c: Any) => `${c.formula}${c.ihd !== undefined ? ` (IHD ${c.ihd})` : ''}`).join(', ') });
  }
  if (Array.isArray(i.losses) && i.losses.length) {
    out.push({ label: 'Losses from M', value: i.losses.slice(0, 6).map((l: Any) => `−${l.loss}${l.composition ? ` (${l.composition})` : ''}`).join(', ') });
  }
  if (Array.isArray(i.fragments) && i.fragments.length) {
    out.push({ label: 'Fragment ions', value: i.fragments.slice(0, 6).map((f: Any) => `${f.mz}${f.composition ? ` ${f.composition}` : ''}`).join(', ') });
  }
  return out;
}
