// Shapes of an identification report: what is stored, what is evaluated, what
// the API answers. The report table's JSON columns hold these.
import type { Role } from '../roles';

export const REPORT_STATUSES = ['draft', 'submitted', 'approved', 'returned'] as const;
export type ReportStatus = (typeof REPORT_STATUSES)[number];

export const CONCLUSIONS = ['identified', 'tentative', 'not_in_library'] as const;
export type Conclusion = (typeof CONCLUSIONS)[number];

export const CONCLUSION_LABELS: Record<Conclusion, string> = {
  identified: 'Identified',
  tentative: 'Tentative',
  not_in_library: 'Not in library',
};

export const STATUS_LABELS: Record<ReportStatus, string> = {
  draft: 'Draft',
  submitted: 'Submitted for review',
  approved: 'Approved',
  returned: 'Returned',
};

/** The meaning recorded with a reviewer's electronic signature. */
export const APPROVAL_MEANING = 'reviewed and approved';

export const REPORT_CAUTION =
  'A library hit is a candidate, not a confirmed identity. An identification must be confirmed with an authentic reference standard analysed under the laboratory\'s own procedures and local regulations.';

export interface Actor {
  id: string;
  email: string;
  name: string;
  roles: Role[];
}

export type Peak = [number, number];

export interface SnapshotHit {
  rank: number;
  spectrumId: number;
  version: number;
  name: string;
  formula: string | null;
  nominalMass: number | null;
  ihd: number | null;
  scores: { cosine: number; reverseCosine: number; composite: number; entropy: number };
  score: number;
  riDelta?: number;
}

/** What was searched, how, against what, and what came back. */
export interface ReportSnapshot {
  query: { peaks: Peak[]; sourceFileName: string | null };
  search: { filters: Record<string, unknown>; options: Record<string, unknown>; limit: number | null };
  hits: SnapshotHit[];
  interpretation: unknown;
  riLadder: unknown;
  library: { version: number; size: number };
  appVersion: string;
  takenAt: string;
}

export interface SampleDetails {
  sampleId?: string;
  retentionTime?: number;
  retentionIndex?: number;
  riPhase?: string;
  instrument?: string;
  method?: string;
  notes?: string;
}

export interface ReferenceStandard {
  name?: string;
  lot: string;
  /** YYYY-MM-DD, the day the standard was analysed alongside the sample. */
  analysisDate: string;
  retentionIndex?: number;
  notes?: string;
}

export interface AcceptanceCriteria {
  /** Lowest ranking score (0..1) the selected hit may have. @default 0.8 */
  minimumScore: number;
  /** Half-width of the accepted retention-index window. @default 20 */
  riWindow: number;
  /** How many of the reference's most intense ions are compared. @default 5 */
  keyIonCount: number;
  /** Relative tolerance on each key ion's relative intensity (0.2 = 20 %). @default 0.2 */
  keyIonTolerance: number;
  /** Hits this close to the top score are alternatives to address. @default 0.02 */
  isomerMargin: number;
}

export type CriterionStatus = 'pass' | 'fail' | 'not_evaluated';

export interface KeyIonResult {
  mz: number;
  reference: number;
  query: number | null;
  deviation: number | null;
  pass: boolean;
}

export interface CriterionResult {
  key: 'minimumScore' | 'retentionIndex' | 'keyIons' | 'isomerMargin' | 'alternativesAddressed';
  label: string;
  status: CriterionStatus;
  detail: string;
  value?: number | null;
  threshold?: number;
  ions?: KeyIonResult[];
}

export interface Alternative {
  rank: number;
  recordId: number;
  version: number;
  name: string;
  score: number;
  /** Top score minus this hit's score. */
  delta: number;
  addressed: boolean;
}

export interface CriteriaEvaluation {
  settings: { name: 'acceptance-criteria'; version: number | null; value: AcceptanceCriteria };
  selected: { recordId: number; version: number; name: string; score: number } | null;
  results: CriterionResult[];
  alternatives: Alternative[];
  allPass: boolean;
  evaluatedAt: string;
}

export type IntegrityStatus = 'intact' | 'altered' | 'unsigned';
