import { canonicalLabel } from './canonicalLabel';
import { normalizeFormula } from './normalizeFormula';
import type { Peak } from './types';

/** What writeJcamp writes: a record's metadata and its peaks. */
export interface JcampSpectrumInput {
  title: string;
  names?: string[];
  formula?: string | null;
  casRegistryNo?: string | null;
  mw?: number | null;
  origin?: string | null;
  owner?: string | null;
  spectrometer?: string | null;
  ionizationMode?: string | null;
  /** eV */
  ionizationEnergy?: number | null;
  retentionIndex?: number | null;
  retentionTime?: number | null;
  /** Written as `##$KEY=value`. */
  userLabels?: Record<string, string>;
  peaks: Peak[];
}

export interface WriteJcampOptions {
  /**
   * The `$` label that carries the retention index.
   * @default 'RETENTION INDEX'
   */
  retentionIndexLabel?: string;
  /**
   * Y units written in ##YUNITS=.
   * @default 'RELATIVE ABUNDANCE'
   */
  yUnits?: string;
}

/**
 * Write one mass spectrum as JCAMP-DX 5.01 with a `(XY..XY)` peak table,
 * one peak a line, numbers in JavaScript's shortest round-trip form so that
 * readJcamp gives back the same peaks. Labels as in McDonald and Wilks,
 * Appl. Spectrosc. 42 (1988) 151 and, for mass spectra, Lampen et al.,
 * Appl. Spectrosc. 48 (1994) 1545. The retention index has no standard
 * label and goes in a `$` label. Text that JCAMP-DX cannot carry is made
 * safe: line breaks in one-line values become blanks, `$$` (a comment mark)
 * becomes `$ $`, and a value line starting with `##` gets a leading `# `.
 * @param spectrum - metadata and peaks.
 * @param options - label choices.
 * @returns the file's text, LF line ends, ending with `##END=` and a newline.
 */
export function writeJcamp(spectrum: JcampSpectrumInput, options: WriteJcampOptions = {}): string {
  const { retentionIndexLabel = 'RETENTION INDEX', yUnits = 'RELATIVE ABUNDANCE' } = options;
  if (!spectrum || typeof spectrum !== 'object') throw new RangeError('spectrum must be an object');
  if (typeof spectrum.title !== 'string') throw new RangeError('spectrum.title must be a string');
  if (!Array.isArray(spectrum.peaks)) throw new RangeError('spectrum.peaks must be an array');
  if (canonicalLabel(retentionIndexLabel) === '' || /[=\n]/.test(retentionIndexLabel)) {
    throw new RangeError('retentionIndexLabel must be a non-empty label without "=" or line breaks');
  }
  const peaks = spectrum.peaks.map((peak, i): Peak => {
    if (!Array.isArray(peak) || !Number.isFinite(peak[0]) || !Number.isFinite(peak[1])) {
      throw new RangeError(`spectrum.peaks[${i}] must be [mz, intensity] with finite numbers`);
    }
    return [peak[0], peak[1]];
  });
  peaks.sort((a, b) => a[0] - b[0]);

  const lines: string[] = [];
  const used = new Set<string>();
  const add = (label: string, value: string | number | null | undefined, multiLine = false) => {
    if (value === null || value === undefined) return;
    const canon = canonicalLabel(label);
    if (used.has(canon)) return;
    used.add(canon);
    lines.push(`##${label}=${safeValue(String(value), multiLine)}`);
  };
  const number = (value: number | null | undefined, name: string): number | null => {
    if (value === null || value === undefined) return null;
    if (!Number.isFinite(value)) throw new RangeError(`spectrum.${name} must be a finite number or null`);
    return value;
  };

  add('TITLE', spectrum.title);
  add('JCAMP-DX', '5.01');
  add('DATA TYPE', 'MASS SPECTRUM');
  add('DATA CLASS', 'PEAK TABLE');
  add('ORIGIN', spectrum.origin ?? '?');
  add('OWNER', spectrum.owner ?? '?');
  const names = (spectrum.names ?? []).map((name) => safeValue(name, false).trim()).filter(Boolean);
  if (names.length > 0) add('NAMES', names.join('\n'), true);
  const formula = spectrum.formula ? normalizeFormula(spectrum.formula) : null;
  if (formula) add('MOLFORM', spacedFormula(formula));
  add('CAS REGISTRY NO', spectrum.casRegistryNo || null);
  add('MW', number(spectrum.mw, 'mw'));
  add('SPECTROMETER/DATA SYSTEM', spectrum.spectrometer || null);
  add('.IONIZATION MODE', spectrum.ionizationMode || null);
  add('.IONIZATION ENERGY', number(spectrum.ionizationEnergy, 'ionizationEnergy'));
  add('.RETENTION TIME', number(spectrum.retentionTime, 'retentionTime'));
  add(`$${retentionIndexLabel}`, number(spectrum.retentionIndex, 'retentionIndex'));
  for (const [key, value] of Object.entries(spectrum.userLabels ?? {})) {
    const label = key.replace(/[=\n\r]/g, ' ').trim();
    if (label === '' || label.startsWith('$')) continue;
    add(`$${label}`, String(value), true);
  }
  add('XUNITS', 'M/Z');
  add('YUNITS', yUnits);
  add('XFACTOR', 1);
  add('YFACTOR', 1);
  if (peaks.length > 0) {
    add('FIRSTX', peaks[0][0]);
    add('LASTX', peaks.at(-1)![0]);
  }
  add('NPOINTS', peaks.length);
  lines.push('##PEAK TABLE=(XY..XY)');
  for (const [mz, intensity] of peaks) lines.push(`${mz}, ${intensity}`);
  lines.push('##END=');
  return `${lines.join('\n')}\n`;
}

function safeValue(value: string, multiLine: boolean): string {
  let text = value.replace(/\r\n?/g, '\n').replace(/\$\$/g, '$ $');
  // eslint-disable-next-line no-control-regex
  text = text.replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/g, ' ');
  if (!multiLine) return text.replace(/\n/g, ' ');
  return text
    .split('\n')
    .map((line, i) => (i > 0 && line.trimStart().startsWith('##') ? `# ${line}` : line))
    .join('\n');
}

/** "C6H5Br" -> "C 6 H 5 Br": the spaced MOLFORM the standard shows. */
function spacedFormula(formula: string): string {
  if (!/^(?:[A-Z][a-z]?\d*)+$/.test(formula)) return formula;
  return (formula.match(/[A-Z][a-z]?\d*/g) ?? [])
    .map((token) => token.replace(/^([A-Z][a-z]?)(\d+)$/, '$1 $2'))
    .join(' ');
}
