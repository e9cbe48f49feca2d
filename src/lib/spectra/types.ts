/** One mass spectral peak: [m/z, intensity]. */
export type Peak = [mz: number, intensity: number];

/** How the peaks of a spectrum were obtained from the file. */
export type DataForm = 'peak table' | 'xydata bars' | 'profile centroided' | 'ntuples';

/** A non-blocking remark about what was read; `code` is stable, `message` is for people. */
export interface ReadWarning {
  code: string;
  message: string;
}

/** One spectrum read from a JCAMP-DX file (one block, or one NTUPLES page). */
export interface ParsedSpectrum {
  title: string;
  /** NAMES, one entry a line (synonyms). */
  names: string[];
  /** MOLFORM with its spacing removed ("C 6 H 6" -> "C6H6"), or null. */
  formula: string | null;
  casRegistryNo: string | null;
  mw: number | null;
  origin: string | null;
  owner: string | null;
  /** SPECTROMETER/DATA SYSTEM */
  spectrometer: string | null;
  /** .IONIZATION MODE, e.g. "EI+" */
  ionizationMode: string | null;
  /** eV, from .IONIZATION ENERGY or a `$` label carrying it. */
  ionizationEnergy: number | null;
  retentionIndex: number | null;
  /** As written in the file (usually seconds for NTUPLES pages, see the units). */
  retentionTime: number | null;
  /** 1-based page number inside an NTUPLES section, else null. */
  page: number | null;
  /** `$`-prefixed labels, keyed by the label as written without the `$`. */
  userLabels: Record<string, string>;
  /** Labels read for this spectrum, as written (upper case, trimmed). */
  fieldsRead: string[];
  /** m/z ascending, intensities > 0. */
  peaks: Peak[];
  dataForm: DataForm;
}

export type ReadJcampResult =
  | { ok: true; spectra: ParsedSpectrum[]; blocksFound: number; warnings: ReadWarning[] }
  | { ok: false; error: string };
