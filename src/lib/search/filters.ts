import type { LibraryEntry, SearchFilters, SpectrumStatus } from './types';

export type EntryMeta = Omit<LibraryEntry, 'peaks'>;

const STATUSES: readonly SpectrumStatus[] = ['released', 'in_review', 'draft'];

/** Formula in Hill order (C, H, then alphabetical; alphabetical without C), for equality tests. */
export function hillKey(formula: string): string {
  const counts = new Map<string, number>();
  const re = /([A-Z][a-z]?)(\d*)/g;
  const compact = formula.replace(/\s+/g, '');
  let m: RegExpExecArray | null;
  let consumed = 0;
  while ((m = re.exec(compact)) !== null) {
    if (m.index !== consumed) return compact; // not a plain formula: compare as written
    consumed = m.index + m[0].length;
    counts.set(m[1], (counts.get(m[1]) ?? 0) + (m[2] === '' ? 1 : Number(m[2])));
  }
  if (consumed !== compact.length || counts.size === 0) return compact;
  const symbols = [...counts.keys()].filter((s) => (counts.get(s) as number) > 0).sort();
  const ordered = counts.has('C') ? ['C', ...(counts.has('H') ? ['H'] : []), ...symbols.filter((s) => s !== 'C' && s !== 'H')] : symbols;
  return ordered.map((s) => s + ((counts.get(s) as number) === 1 ? '' : String(counts.get(s)))).join('');
}

function checkRange(name: string, v: number | undefined, max: number): void {
  if (v === undefined) return;
  if (typeof v !== 'number' || !Number.isFinite(v) || v < 0 || v > max) throw new RangeError(`${name} must be a number in 0..${max}`);
}

/** Reject malformed filters with a RangeError naming the field. */
export function checkFilters(f: SearchFilters = {}): void {
  checkRange('massMin', f.massMin, 5000);
  checkRange('massMax', f.massMax, 5000);
  if (f.ihdMin !== undefined && !Number.isFinite(f.ihdMin)) throw new RangeError('ihdMin must be a finite number');
  if (f.ihdMax !== undefined && !Number.isFinite(f.ihdMax)) throw new RangeError('ihdMax must be a finite number');
  for (const key of ['elements', 'excludeElements', 'tags'] as const) {
    const v = f[key];
    if (v !== undefined && (!Array.isArray(v) || v.some((s) => typeof s !== 'string'))) throw new RangeError(`${key} must be an array of strings`);
  }
  if (f.status !== undefined && (!Array.isArray(f.status) || f.status.some((s) => !STATUSES.includes(s)))) {
    throw new RangeError(`status must hold only ${STATUSES.join(', ')}`);
  }
  if (f.formula !== undefined && typeof f.formula !== 'string') throw new RangeError('formula must be a string');
  if (f.ri !== undefined) {
    const { value, window, phase, penalty } = f.ri;
    if (!Number.isFinite(value) || value < 0) throw new RangeError('ri.value must be a number >= 0');
    if (!Number.isFinite(window) || window < 0) throw new RangeError('ri.window must be a number >= 0');
    if (typeof phase !== 'string' || phase === '') throw new RangeError('ri.phase must be a non-empty string');
    if (penalty !== undefined && (!Number.isFinite(penalty) || penalty < 0 || penalty > 1)) throw new RangeError('ri.penalty must be a number in 0..1');
  }
}

/**
 * A filter as a predicate over entries: 0 excluded, 1 searched, 2 searched
 * with the RI penalty. Status defaults to released only.
 */
export function compileFilters(f: SearchFilters = {}): (meta: EntryMeta) => 0 | 1 | 2 {
  checkFilters(f);
  const status = new Set<SpectrumStatus>(f.status ?? ['released']);
  const formula = f.formula !== undefined && f.formula.trim() !== '' ? hillKey(f.formula) : null;
  const need = f.elements ?? [];
  const avoid = f.excludeElements ?? [];
  const tags = f.tags ?? [];
  const ri = f.ri;
  return (m) => {
    if (!status.has(m.status)) return 0;
    if (formula !== null && (m.formula === null || hillKey(m.formula) !== formula)) return 0;
    if (f.massMin !== undefined && (m.nominalMass === null || m.nominalMass < f.massMin)) return 0;
    if (f.massMax !== undefined && (m.nominalMass === null || m.nominalMass > f.massMax)) return 0;
    if (f.ihdMin !== undefined && (m.ihd === null || m.ihd < f.ihdMin)) return 0;
    if (f.ihdMax !== undefined && (m.ihd === null || m.ihd > f.ihdMax)) return 0;
    for (const el of need) if (!m.elements.includes(el)) return 0;
    for (const el of avoid) if (m.elements.includes(el)) return 0;
    for (const tag of tags) if (!m.tags.includes(tag)) return 0;
    if (ri) {
      const own = m.ri.find((r) => r.phase === ri.phase);
      const inside = own !== undefined && Math.abs(own.value - ri.value) <= ri.window;
      if (!inside) return ri.penalty === undefined ? 0 : 2;
    }
    return 1;
  };
}

/** Library RI minus the filter's, when the spectrum has one on the filter's phase. */
export function riDelta(meta: EntryMeta, f: SearchFilters | undefined): number | undefined {
  if (!f?.ri) return undefined;
  const own = meta.ri.find((r) => r.phase === f.ri?.phase);
  return own === undefined ? undefined : own.value - f.ri.value;
}
