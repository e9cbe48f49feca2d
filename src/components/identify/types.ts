// Shapes of the answers the Identify view reads (API.md).
export type ScoreKey = 'cosine' | 'reverseCosine' | 'composite' | 'entropy';

export interface Hit {
  rank: number;
  /** the record id */
  spectrumId: number;
  recordId?: number;
  version: number;
  name: string;
  formula: string | null;
  nominalMass: number | null;
  ihd: number | null;
  scores: Record<ScoreKey, number>;
  score: number;
  riDelta?: number;
  synthetic?: boolean;
}

export interface SearchAnswer {
  hits: Hit[];
  searched: number;
  tookMs: number;
}

export interface HalogenFitAnswer {
  Cl: number;
  Br: number;
  fit: number;
}

export interface Interpretation {
  molecularIon: { mz: number; confidence: number; reasons: string[] } | null;
  isotopeClusters: { mz: number; members?: { mz: number; relative: number }[]; halogens?: HalogenFitAnswer & { alternatives?: HalogenFitAnswer[] } }[];
  halogenEstimate: (HalogenFitAnswer & { alternatives: HalogenFitAnswer[] }) | null;
  nitrogenRule: { nominalMass?: number; parity?: string; nitrogen?: string; note?: string } | string | null;
  losses: { fromMz: number; toMz: number; loss: number; composition: string }[];
  fragments: { mz: number; relative?: number; composition: string }[];
  candidateFormulas: { formula: string; ihd: number; isotopeFit: number | null }[];
}

/** Plain names of the scores (API.md, PRODUCT.md). */
export const SCORE_LABEL: Record<ScoreKey, string> = {
  cosine: 'cosine',
  reverseCosine: 'reverse cosine',
  composite: 'composite (Stein & Scott 1994)',
  entropy: 'spectral entropy similarity',
};

export const SCORE_KEYS: ScoreKey[] = ['cosine', 'reverseCosine', 'composite', 'entropy'];

/** An error answer in words. */
export async function answerError(res: Response, what: string): Promise<string> {
  const body = await res.json().catch(() => null);
  const msg: string | undefined = body?.error?.message;
  switch (res.status) {
    case 400:
      return `${what}: ${msg ?? 'the server did not accept the input'}.`;
    case 401:
      return 'Your session has ended. Sign in again to go on.';
    case 403:
      return msg ?? 'Your roles do not allow this.';
    case 404:
      return `${what}: the server has no such route or item yet${msg ? ` (${msg})` : ''}.`;
    case 413:
      return msg ?? `${what}: the input is over the size limit.`;
    case 429:
      return 'Too many requests in a short time; wait a moment and try again.';
    case 503:
      return msg ?? 'The database or the search index is not available right now; try again shortly.';
    default:
      return `${what}: ${msg ?? `the server answered ${res.status}`}.`;
  }
}
