// Shapes shared by the import pipeline, the review workflow and the routes.
import type { Role } from '../roles';

/** Who makes a change: a signed-in user, or the command line (id null). */
export interface Actor {
  id: string | null;
  email: string;
  name: string;
  roles: readonly Role[];
}

/** The command-line importer acts as a system user (API.md: CLI imports). */
export const CLI_ACTOR: Actor = { id: null, email: 'cli', name: 'command line import', roles: ['curator'] };

export type FileStatus = 'imported' | 'duplicate' | 'rejected' | 'needs_selection' | 'needs_confirmation';
export type BatchFileState = 'queued' | 'processing' | FileStatus;

/** A remark on what was read; `code` from API.md's list (more may be added). */
export interface ImportWarning {
  code: string;
  message: string;
}

/** One spectrum found in a file, with what happened to it. */
export interface FoundSpectrum {
  /** 1-based position among the file's spectra */
  index: number;
  /** NTUPLES page number (1-based position among the pages), else null */
  page: number | null;
  title: string;
  name: string;
  formula: string | null;
  peakCount: number;
  basePeakMz: number | null;
  retentionTime: number | null;
  dataForm: string;
  /** stored: became a new record; duplicate: already in the library; other_compound: same peaks under another compound; skipped: not selected */
  outcome: 'stored' | 'duplicate' | 'other_compound' | 'pending' | 'skipped';
  duplicateOf?: { id: number; version: number };
}

export interface FileReport {
  file: string;
  status: FileStatus;
  spectra: { id: number; version: number; name: string; page: number | null }[];
  /** record id of the existing record, for a duplicate */
  duplicateOf?: number;
  duplicateVersion?: number;
  warnings: ImportWarning[];
  error?: string;
  /** every spectrum found in the file */
  found: FoundSpectrum[];
  /** labels read, over all spectra of the file */
  fieldsRead: string[];
  /** number of NTUPLES pages in the file (0 when none) */
  pageCount: number;
  /** records of the same peaks under another compound (needs_confirmation) */
  samePeaksAs?: { id: number; version: number; name: string }[];
}

export type PageSelection = number[] | 'all';
