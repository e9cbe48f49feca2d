// Synthetic JCAMP-DX files for the reliability runs: a deterministic peak
// table per seed, so every file of a run is a different spectrum (no
// duplicates or near-duplicates between files unless a file is sent twice).
// Invented data: these are not spectra of the named compounds.
export interface JcampOptions {
  title: string;
  names?: string[];
  formula?: string | null;
  mw?: number | null;
  userLabels?: Record<string, string>;
  peaks: [number, number][];
}

/** A small PRNG (mulberry32) so a seed always gives the same spectrum. */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** 20–40 unit-mass peaks between m/z 15 and `top`, base peak 999, unique per seed. */
export function syntheticPeaks(seed: number, top = 300): [number, number][] {
  const r = rng(seed * 7919 + 17);
  const n = 20 + Math.floor(r() * 21);
  const mzs = new Set<number>();
  while (mzs.size < n) mzs.add(15 + Math.floor(r() * (top - 15)));
  const peaks = [...mzs].sort((a, b) => a - b).map((mz) => [mz, 1 + Math.floor(r() * 998)] as [number, number]);
  peaks[Math.floor(r() * peaks.length)][1] = 999;
  return peaks;
}

export function makeJcamp(o: JcampOptions): string {
  const lines = [
    `##TITLE= ${o.title}`,
    '##JCAMP-DX= 5.01',
    '##DATA TYPE= MASS SPECTRUM',
    '##DATA CLASS= PEAK TABLE',
    '##ORIGIN= Ionotheca reliability run (synthetic data)',
    '##OWNER= reliability',
  ];
  if (o.names?.length) lines.push(`##NAMES= ${o.names.join('\n')}`);
  if (o.formula) lines.push(`##MOLFORM= ${o.formula}`);
  if (o.mw) lines.push(`##MW= ${o.mw}`);
  lines.push('##.IONIZATION MODE= EI+', '##.IONIZATION ENERGY= 70 EV');
  for (const [k, v] of Object.entries(o.userLabels ?? {})) lines.push(`##$${k}= ${v}`);
  lines.push('##XUNITS= M/Z', '##YUNITS= RELATIVE ABUNDANCE', `##NPOINTS= ${o.peaks.length}`, '##PEAK TABLE= (XY..XY)');
  for (let i = 0; i < o.peaks.length; i += 6) lines.push(o.peaks.slice(i, i + 6).map(([x, y]) => `${x}, ${y}`).join(' '));
  lines.push('##END=', '');
  return lines.join('\n');
}

/** File `i` of a run: a unique synthetic spectrum named after the run. */
export function runFile(run: string, i: number, seedBase = 1): { name: string; text: string } {
  const name = `${run}-${String(i).padStart(4, '0')}.jdx`;
  const peaks = syntheticPeaks(seedBase * 100_000 + i);
  return { name, text: makeJcamp({ title: `${run} compound ${i} (synthetic)`, names: [`${run} compound ${i}`], peaks }) };
}
