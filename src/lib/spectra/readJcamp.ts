import { convert } from 'jcampconverter';

import { canonicalLabel } from './canonicalLabel';
import { centroidProfile } from './centroidProfile';
import { checkXyLineStarts } from './checkXyLineStarts';
import { normalizeLineEnds } from './decodeText';
import { decodeXyData } from './decodeXyData';
import { normalizeFormula } from './normalizeFormula';
import { parseJcampNumber, parseLeadingNumber } from './parseJcampNumber';
import { parsePeakTable, type PeakTableForm } from './parsePeakTable';
import {
  recordValue,
  scanJcamp,
  shorten,
  type LabeledRecord,
  type NtuplesPage,
  type NtuplesSection,
  type ScannedBlock,
} from './scanJcamp';
import { tokenizeAsdfLine } from './tokenizeAsdfLine';
import type { DataForm, ParsedSpectrum, Peak, ReadJcampResult, ReadWarning } from './types';
import { validateFileName } from './validateFileName';

export interface ReadJcampOptions {
  /**
   * The uploaded file's name; checked with validateFileName and used in messages.
   * @default undefined (not checked)
   */
  fileName?: string;
  /**
   * Most peaks accepted in one spectrum.
   * @default 100_000
   */
  maxPeaks?: number;
  /**
   * Most data points accepted in one XYDATA record (profile data).
   * @default 10_000_000
   */
  maxPoints?: number;
  /**
   * XYDATA whose spacing is within 1 ± this (in m/z) is bar data, every
   * non-zero point a peak; finer spacing is profile data and is centroided.
   * @default 0.1
   */
  unitSpacingTolerance?: number;
  /**
   * Profile maxima lower than this fraction of the highest point are dropped as noise.
   * @default 0.001
   */
  centroidMinRelativeHeight?: number;
}

class Rejection extends Error {}

/** Labels of data records; everything else in a block is metadata. */
const DATA_LABELS = new Set(['XYDATA', 'PEAKTABLE', 'DATATABLE', 'XYPOINTS', 'PEAKASSIGNMENTS']);
/** Labels that describe the data rather than the sample. */
const DATA_HEADER_LABELS = new Set([
  'FIRSTX', 'LASTX', 'DELTAX', 'NPOINTS', 'XFACTOR', 'YFACTOR', 'FIRSTY', 'LASTY',
  'MINX', 'MAXX', 'MINY', 'MAXY', 'RESOLUTION',
]);

/**
 * Read a JCAMP-DX file of mass spectra and validate what was read.
 *
 * jcampconverter reads the data; a line-level scan of the same text checks
 * what that lenient reader lets pass (structure, `##END=`, NTUPLES ends,
 * BLOCKS, duplicate labels, the DIF Y-check, X at line starts, NPOINTS,
 * non-finite values, m/z <= 0, the peak limit), and both readings of every
 * value must agree. Supported: peak tables `(XY..XY)` and `(XYW..XYW)`;
 * `(X++(Y..Y))` XYDATA in AFFN and the ASDF forms PAC, SQZ, DIF, DUP, with
 * XFACTOR / YFACTOR (unit-spaced XYDATA is bar data, finer spacing profile
 * data that is centroided); MS NTUPLES whose pages are peak tables (each page
 * a spectrum); LINK compound files; `$$` comments; `?` missing values.
 * Formats: McDonald and Wilks, Appl. Spectrosc. 42 (1988) 151; mass spectra
 * and NTUPLES: Lampen et al., Appl. Spectrosc. 48 (1994) 1545.
 * @param text - the file's text (see decodeText).
 * @param options - file name and limits.
 * @returns the spectra with warnings, or why the file is rejected.
 */
export function readJcamp(text: string, options: ReadJcampOptions = {}): ReadJcampResult {
  const {
    fileName,
    maxPeaks = 100_000,
    maxPoints = 10_000_000,
    unitSpacingTolerance = 0.1,
    centroidMinRelativeHeight = 0.001,
  } = options;
  if (!Number.isInteger(maxPeaks) || maxPeaks < 1) throw new RangeError('maxPeaks must be a positive integer');
  if (!Number.isInteger(maxPoints) || maxPoints < 1) throw new RangeError('maxPoints must be a positive integer');
  if (!(unitSpacingTolerance >= 0 && unitSpacingTolerance < 0.5)) {
    throw new RangeError('unitSpacingTolerance must be in [0, 0.5)');
  }
  if (!(centroidMinRelativeHeight >= 0 && centroidMinRelativeHeight < 1)) {
    throw new RangeError('centroidMinRelativeHeight must be in [0, 1)');
  }
  if (fileName !== undefined) {
    const name = validateFileName(fileName);
    if (!name.ok) return { ok: false, error: name.error };
  }
  if (typeof text !== 'string') return { ok: false, error: 'the file is not text' };
  try {
    return readValidated(normalizeLineEnds(text), {
      maxPeaks,
      maxPoints,
      unitSpacingTolerance,
      centroidMinRelativeHeight,
    });
  } catch (error) {
    if (error instanceof Rejection) return { ok: false, error: error.message };
    // an unexpected failure inside the reader still rejects the file, with the reason
    return {
      ok: false,
      error: `the file could not be read: ${error instanceof Error ? error.message : String(error)}`,
    };
  }
}

interface Limits {
  maxPeaks: number;
  maxPoints: number;
  unitSpacingTolerance: number;
  centroidMinRelativeHeight: number;
}

function readValidated(text: string, limits: Limits): ReadJcampResult {
  const binary = findBinary(text);
  if (binary) return { ok: false, error: binary };
  if (text.trim() === '') return { ok: false, error: 'the file is empty' };

  const scanned = scanJcamp(text);
  if (!scanned.ok) return scanned;
  const { blocks } = scanned;
  const warnings: ReadWarning[] = scanned.notes.map((message) => ({ code: 'text_after_end', message }));
  const warn = (code: string, message: string) => warnings.push({ code, message });

  for (const block of blocks) {
    const own = byLabel(block.records);
    if (!lookUp(block, 'JCAMPDX')) {
      return {
        ok: false,
        error: `not a JCAMP-DX file: the block "${shorten(block.title)}" (line ${block.line}) has no ##JCAMP-DX= label`,
      };
    }
    const blocksRecord = own.get('BLOCKS');
    if (blocksRecord) {
      const stated = parseJcampNumber(recordValue(blocksRecord));
      if (!stated.ok || stated.value === null || !Number.isInteger(stated.value)) {
        return { ok: false, error: `line ${blocksRecord.line}: ##BLOCKS= needs a whole number` };
      }
      // BLOCKS counts the blocks linked inside this one (from memory: JCAMP-DX 4.24 compound files)
      if (stated.value !== block.children.length) {
        return {
          ok: false,
          error: `line ${blocksRecord.line}: ##BLOCKS= says ${stated.value} blocks but the block "${shorten(block.title)}" holds ${block.children.length}`,
        };
      }
    }
  }

  const spectra: ParsedSpectrum[] = [];
  for (const block of blocks) {
    const own = byLabel(block.records);
    const dataType = canonicalLabel(valueOf(own.get('DATATYPE')) ?? '');
    const dataRecords = block.records.filter((record) => DATA_LABELS.has(record.canon));
    const where = `block "${shorten(block.title)}" (line ${block.line})`;
    if (dataType === 'LINK' || (block.children.length > 0 && dataRecords.length === 0 && block.ntuples.length === 0)) {
      continue;
    }
    if (dataRecords.length === 0 && block.ntuples.length === 0) {
      warn('no_data', `${where} holds no spectral data and was skipped`);
      continue;
    }
    if (dataType === '') {
      warn('data_type_missing', `${where} has no ##DATA TYPE=; read as a mass spectrum`);
    } else if (!dataType.includes('MASSSPECTRUM')) {
      warn('not_mass_spectrum', `${where} is a ${valueOf(own.get('DATATYPE'))}, not a mass spectrum, and was skipped`);
      continue;
    }
    const xUnits = valueOf(own.get('XUNITS'));
    if (xUnits && !/^(M\/?Z|MASS|AMU|DA|DALTONS?|TH|THOMSONS?|U)$/i.test(xUnits.replace(/\s+/g, ''))) {
      warn('x_units', `${where}: X units "${xUnits}" are not m/z; the values were read as m/z`);
    }

    if (block.ntuples.length > 0) {
      if (dataRecords.length > 0) {
        warn('xydata_ignored', `${where}: data outside the NTUPLES section was ignored`);
      }
      for (const section of block.ntuples) {
        spectra.push(...readNtuples(block, section, limits, warn));
      }
      continue;
    }

    const peakTable = dataRecords.find((record) => record.canon === 'PEAKTABLE' || record.canon === 'XYPOINTS');
    const xyData = dataRecords.find((record) => record.canon === 'XYDATA');
    const chosen = peakTable ?? xyData;
    if (!chosen) {
      warn('no_data', `${where}: only ##${dataRecords[0].label}= data, which is not read; skipped`);
      continue;
    }
    if (peakTable && xyData) {
      warn('xydata_ignored', `${where}: both a peak table and XYDATA; the peak table was read`);
    }
    const metadata = readMetadata(block, [], warn);
    if (chosen === xyData) {
      const { peaks, dataForm } = readXyDataRecord(block, chosen, limits, warn);
      spectra.push({ ...metadata, peaks, dataForm, page: null });
    } else {
      const peaks = readPeakTableRecord(chosen, block.records, null, limits, warn);
      spectra.push({ ...metadata, peaks, dataForm: 'peak table', page: null });
    }
  }

  if (spectra.length === 0) {
    const why = warnings.filter((w) => w.code !== 'text_after_end').map((w) => w.message);
    return { ok: false, error: `no mass spectrum found in the file${why.length ? `: ${why.join('; ')}` : ''}` };
  }
  for (const spectrum of spectra) {
    if (spectrum.peaks.length === 0) {
      const label = spectrum.page === null ? `"${shorten(spectrum.title)}"` : `"${shorten(spectrum.title)}" page ${spectrum.page}`;
      return { ok: false, error: `the spectrum ${label} has no peaks with an intensity above zero` };
    }
  }
  return { ok: true, spectra, blocksFound: blocks.length, warnings };
}

// ---------------------------------------------------------------- structure

function findBinary(text: string): string | null {
  if (text.includes('\u0000')) return 'binary data, not a JCAMP-DX text file (it contains NUL bytes)';
  // eslint-disable-next-line no-control-regex
  const control = /[\u0001-\u0008\u000b\u000e-\u001f\u007f]/g;
  const found = text.match(control);
  if (found) {
    const at = text.search(control);
    const line = text.slice(0, at).split('\n').length;
    return found.length > 8
      ? 'binary data, not a JCAMP-DX text file (it contains control characters)'
      : `line ${line}: a control character (U+${found[0].charCodeAt(0).toString(16).padStart(4, '0')}) in the text`;
  }
  if (text.includes('\ufffd')) {
    return 'the text contains undecodable characters (U+FFFD): not a JCAMP-DX text file';
  }
  return null;
}

function byLabel(records: LabeledRecord[]): Map<string, LabeledRecord> {
  return new Map(records.map((record) => [record.canon, record]));
}

/** A label of the block, or of the blocks that link it. */
function lookUp(block: ScannedBlock | null, canon: string): LabeledRecord | undefined {
  for (let b = block; b; b = b.parent) {
    const found = b.records.find((record) => record.canon === canon);
    if (found) return found;
  }
  return undefined;
}

function valueOf(record: LabeledRecord | undefined): string | null {
  if (!record) return null;
  const value = recordValue(record);
  return value === '' || value === '?' ? null : value;
}

// ---------------------------------------------------------------- metadata

type Metadata = Omit<ParsedSpectrum, 'peaks' | 'dataForm' | 'page'>;

function readMetadata(
  block: ScannedBlock,
  extra: LabeledRecord[],
  warn: (code: string, message: string) => void,
): Metadata {
  // own labels (and NTUPLES header / page labels) first, then those of linking blocks
  const merged = new Map<string, LabeledRecord>();
  for (const record of [...extra, ...block.records]) if (!merged.has(record.canon)) merged.set(record.canon, record);
  for (let b = block.parent; b; b = b.parent) {
    for (const record of b.records) {
      if (record.canon === 'TITLE' || DATA_LABELS.has(record.canon) || DATA_HEADER_LABELS.has(record.canon)) continue;
      if (['BLOCKS', 'DATATYPE', 'DATACLASS', 'BLOCKID', 'CROSSREFERENCE'].includes(record.canon)) continue;
      if (!merged.has(record.canon)) merged.set(record.canon, record);
    }
  }
  const get = (canon: string) => valueOf(merged.get(canon));
  const number = (canon: string): number | null => {
    const value = get(canon);
    if (value === null) return null;
    const parsed = parseLeadingNumber(value);
    if (parsed === null) {
      warn('unparsable_value', `line ${merged.get(canon)!.line}: ##${merged.get(canon)!.label}= "${shorten(value)}" is not a number; ignored`);
    }
    return parsed;
  };
  // `$` labels read into a typed field below are not repeated in userLabels
  const consumed = new Set<LabeledRecord>();
  const userNumber = (test: (canon: string) => boolean): number | null => {
    for (const record of merged.values()) {
      if (record.canon.startsWith('$') && test(record.canon.slice(1))) {
        const value = parseLeadingNumber(recordValue(record));
        if (value !== null) {
          consumed.add(record);
          return value;
        }
      }
    }
    return null;
  };
  const title = (valueOf(block.records[0]) ?? '').replace(/\s*\n\s*/g, ' ');
  const names = (get('NAMES') ?? '')
    .split('\n')
    .map((name) => name.trim())
    .filter((name) => name !== '' && name !== '?');
  const molform = get('MOLFORM');
  const ionizationEnergy =
    number('.IONIZATIONENERGY') ??
    number('.IONISATIONENERGY') ??
    userNumber((c) => /IONI[SZ]ATIONENERGY|ELECTRONENERGY/.test(c));
  const retentionIndex =
    number('RETENTIONINDEX') ??
    number('.RETENTIONINDEX') ??
    userNumber((c) => c === 'RI' || c.includes('RETENTIONINDEX') || c.startsWith('KOVATS'));
  const retentionTime =
    number('.RETENTIONTIME') ?? number('RETENTIONTIME') ?? userNumber((c) => c === 'RETENTIONTIME' || c === 'RT');
  const userLabels: Record<string, string> = {};
  for (const record of merged.values()) {
    if (record.label.startsWith('$') && !consumed.has(record)) {
      userLabels[record.label.slice(1).trim()] = recordValue(record);
    }
  }
  const fieldsRead = [...new Set([...merged.values()].map((record) => record.label.toUpperCase()))];
  return {
    title,
    names,
    formula: molform === null ? null : normalizeFormula(molform),
    casRegistryNo: get('CASREGISTRYNO'),
    mw: number('MW'),
    origin: get('ORIGIN'),
    owner: get('OWNER'),
    spectrometer: get('SPECTROMETERDATASYSTEM') ?? get('SPECTROMETER'),
    ionizationMode: get('.IONIZATIONMODE') ?? get('.IONISATIONMODE'),
    ionizationEnergy,
    retentionIndex,
    retentionTime,
    userLabels,
    fieldsRead,
  };
}

// ---------------------------------------------------------------- numbers

function headerNumber(records: Map<string, LabeledRecord>, canon: string, required: boolean, context: string): number | null {
  const record = records.get(canon);
  if (!record) {
    if (required) throw new Rejection(`${context}: ##${canon}= is required`);
    return null;
  }
  const parsed = parseJcampNumber(recordValue(record));
  if (!parsed.ok) throw new Rejection(`line ${record.line}: ##${record.label}= ${parsed.error}`);
  if (parsed.value === null && required) throw new Rejection(`line ${record.line}: ##${record.label}= has no value`);
  return parsed.value;
}

function factor(records: Map<string, LabeledRecord>, canon: string, context: string): number {
  const value = headerNumber(records, canon, false, context) ?? 1;
  if (value === 0) throw new Rejection(`line ${records.get(canon)!.line}: ##${records.get(canon)!.label}= must not be zero`);
  return value;
}

function finiteOrReject(value: number, message: string): number {
  if (!Number.isFinite(value)) throw new Rejection(message);
  return value;
}

// ---------------------------------------------------------------- XYDATA

function readXyDataRecord(
  block: ScannedBlock,
  record: LabeledRecord,
  limits: Limits,
  warn: (code: string, message: string) => void,
): { peaks: Peak[]; dataForm: DataForm } {
  const context = `line ${record.line}: ##${record.label}=`;
  if (compact(record.head) !== '(X++(Y..Y))') {
    throw new Rejection(`${context} "${record.head}" is not supported; XYDATA must be (X++(Y..Y))`);
  }
  const own = byLabel(block.records);
  const firstX = headerNumber(own, 'FIRSTX', true, context) as number;
  const lastX = headerNumber(own, 'LASTX', true, context) as number;
  const nPoints = headerNumber(own, 'NPOINTS', true, context) as number;
  const xFactor = factor(own, 'XFACTOR', context);
  const yFactor = factor(own, 'YFACTOR', context);
  const statedDeltaX = headerNumber(own, 'DELTAX', false, context);
  if (!Number.isInteger(nPoints) || nPoints < 1) {
    throw new Rejection(`line ${own.get('NPOINTS')!.line}: ##NPOINTS= must be a positive whole number`);
  }
  if (nPoints > limits.maxPoints) {
    throw new Rejection(`${context} ${nPoints} points is more than the limit of ${limits.maxPoints}`);
  }

  const decoded = decodeXyData(record.lines, record.lineNumbers, { xFactor, maxPoints: limits.maxPoints });
  if (!decoded.ok) throw new Rejection(decoded.error);
  const { y: rawY } = decoded;
  if (rawY.length !== nPoints) {
    throw new Rejection(`##NPOINTS= says ${nPoints} points but the XYDATA at line ${record.line} holds ${rawY.length}`);
  }
  const deltaX = nPoints > 1 ? (lastX - firstX) / (nPoints - 1) : (statedDeltaX ?? 1);
  if (statedDeltaX !== null && nPoints > 1) {
    if (Math.abs(statedDeltaX - deltaX) > 0.01 * Math.abs(deltaX) + 1e-12) {
      throw new Rejection(
        `##DELTAX= ${statedDeltaX} contradicts (LASTX - FIRSTX) / (NPOINTS - 1) = ${Number(deltaX.toPrecision(10))}`,
      );
    }
  }
  if (nPoints > 1 && deltaX === 0) throw new Rejection(`${context} FIRSTX equals LASTX`);
  const lineError = checkXyLineStarts(decoded.lineStarts, firstX, deltaX);
  if (lineError) throw new Rejection(lineError);
  if (decoded.lastLineUnchecked) {
    warn('dif_unchecked', `${context} the last data line ends in DIF form without a Y-check line`);
  }

  const x = new Array<number>(nPoints);
  const y = new Array<number>(nPoints);
  let missing = 0;
  for (let i = 0; i < nPoints; i++) {
    x[i] = firstX + i * deltaX;
    y[i] = rawY[i] * yFactor;
    if (Number.isNaN(rawY[i])) missing++;
    else finiteOrReject(y[i], `${context} a value times YFACTOR is not a finite number`);
  }
  if (missing > 0) warn('missing_value', `${context} ${missing} missing value(s) ("?") skipped`);

  crossCheckXyData(block, record, rawY, x, y);

  const spacing = Math.abs(deltaX);
  const bars = nPoints === 1 || spacing >= 1 - limits.unitSpacingTolerance;
  if (bars) {
    if (spacing > 1 + limits.unitSpacingTolerance) {
      warn('coarse_spacing', `${context} points ${Number(spacing.toPrecision(6))} m/z apart were read as bars`);
    }
    const peaks: Peak[] = [];
    for (let i = 0; i < nPoints; i++) {
      if (Number.isNaN(y[i]) || y[i] === 0) continue;
      if (y[i] < 0) throw new Rejection(`${context} negative intensity ${y[i]} at m/z ${x[i]}`);
      if (!(x[i] > 0)) throw new Rejection(`${context} m/z ${x[i]} is not positive`);
      peaks.push([x[i], y[i]]);
    }
    return { peaks: finishPeaks(peaks, context, limits, warn), dataForm: 'xydata bars' };
  }
  // profile data: order by m/z, missing points as zero, negative baseline clipped
  const order = deltaX > 0 ? x.map((_, i) => i) : x.map((_, i) => nPoints - 1 - i);
  let clipped = 0;
  const px = order.map((i) => x[i]);
  const py = order.map((i) => {
    if (Number.isNaN(y[i])) return 0;
    if (y[i] < 0) {
      clipped++;
      return 0;
    }
    return y[i];
  });
  if (clipped > 0) warn('negative_clipped', `${context} ${clipped} negative profile value(s) set to zero`);
  const peaks = centroidProfile({ x: px, y: py }, { minRelativeHeight: limits.centroidMinRelativeHeight });
  for (const [mz] of peaks) {
    if (!(mz > 0)) throw new Rejection(`${context} a centroid at m/z ${mz} is not positive`);
  }
  return { peaks: finishPeaks(peaks, context, limits, warn), dataForm: 'profile centroided' };
}

/** Read the same XYDATA with jcampconverter and require the same values. */
function crossCheckXyData(block: ScannedBlock, record: LabeledRecord, rawY: number[], x: number[], y: number[]): void {
  const own = byLabel(block.records);
  const header = ['FIRSTX', 'LASTX', 'NPOINTS', 'XFACTOR', 'YFACTOR', 'DELTAX']
    .filter((canon) => own.has(canon))
    .map((canon) => `##${canon}=${recordValue(own.get(canon)!)}`);
  const lines = record.lines.map(lineForConverter);
  const text = miniDocument([...header, '##XYDATA=(X++(Y..Y))', ...lines]);
  const spectrum = convertOne(text, record);
  const cx = spectrum.data?.x ?? [];
  const cy = spectrum.data?.y ?? [];
  if (cx.length !== x.length) {
    throw new Rejection(
      `line ${record.line}: the XYDATA reads as ${x.length} points line by line but as ${cx.length} with jcampconverter; the data are ambiguous`,
    );
  }
  let scale = 1e-300;
  for (const value of y) if (Math.abs(value) > scale) scale = Math.abs(value);
  for (let i = 0; i < x.length; i++) {
    const xOk = Math.abs(cx[i] - x[i]) <= 1e-6 * Math.max(1, Math.abs(x[i]));
    const yOk = Number.isNaN(rawY[i]) || Math.abs(cy[i] - y[i]) <= 1e-9 * scale;
    if (!xOk || !yOk) {
      throw new Rejection(
        `line ${record.line}: point ${i + 1} reads as (${x[i]}, ${y[i]}) line by line but as (${cx[i]}, ${cy[i]}) with jcampconverter; the data are ambiguous`,
      );
    }
  }
}

/**
 * A data line as jcampconverter can read it: `?` becomes the SQZ zero `@`
 * (the point is dropped later), an AFFN exponent becomes a plain decimal
 * (jcampconverter reads `E` as the SQZ digit +5).
 */
function lineForConverter(line: string): string {
  const tokenized = tokenizeAsdfLine(line);
  if (tokenized.ok && tokenized.tokens.some((token) => /[eE]/.test(token.text) && token.kind === 'value' && /\d[eE]|\.[eE]/.test(token.text))) {
    return tokenized.tokens.map((token) => (token.kind === 'missing' ? '@' : plainDecimal(token.value))).join(' ');
  }
  // jcampconverter takes a comma for a decimal point, the standard for a separator
  return line.replace(/\?/g, ' @ ').replace(/,/g, ' ');
}

function plainDecimal(value: number): string {
  if (Math.abs(value) >= 1e21) return BigInt(value).toString();
  const text = String(value);
  if (!/e/i.test(text)) return text;
  // toFixed(100) spells out the exact binary value, which reads back to the same number
  return value.toFixed(100).replace(/\.?0+$/, '');
}

function miniDocument(lines: string[]): string {
  return ['##TITLE=check', '##JCAMP-DX=5.01', '##DATA TYPE=MASS SPECTRUM', ...lines, '##END=', ''].join('\n');
}

function convertOne(text: string, record: LabeledRecord): { data?: Record<string, number[]> } {
  let result;
  try {
    result = convert(text, { keepRecordsRegExp: /^$/ });
  } catch (error) {
    throw new Rejection(
      `line ${record.line}: jcampconverter could not read the data: ${error instanceof Error ? error.message : String(error)}`,
    );
  }
  const spectrum = result.flatten[0]?.spectra?.[0];
  if (!spectrum) throw new Rejection(`line ${record.line}: jcampconverter found no data in ##${record.label}=`);
  return spectrum;
}

// ---------------------------------------------------------------- peak tables

function peakTableForm(descriptor: string): PeakTableForm | null {
  const form = compact(descriptor);
  if (form === '(XY..XY)') return 'XY';
  if (form === '(XYW..XYW)') return 'XYW';
  return null;
}

/**
 * Read a peak table. `headers` gives XFACTOR / YFACTOR / NPOINTS (the block's
 * labels); `ntuples` gives the factors and symbols of an NTUPLES section instead.
 */
function readPeakTableRecord(
  record: LabeledRecord,
  headerRecords: LabeledRecord[],
  ntuples: { section: NtuplesSection; page: NtuplesPage; descriptor: string } | null,
  limits: Limits,
  warn: (code: string, message: string) => void,
): Peak[] {
  const context = ntuples
    ? `line ${record.line}: page ${shorten(recordValue(ntuples.page.page))}`
    : `line ${record.line}: ##${record.label}=`;
  const descriptor = ntuples ? ntuples.descriptor : record.head;
  const form = peakTableForm(descriptor);
  if (!form) {
    throw new Rejection(`${context}: the table form "${descriptor}" is not supported; use (XY..XY) or (XYW..XYW)`);
  }
  const headers = byLabel(headerRecords);
  let xFactor = 1;
  let yFactor = 1;
  if (ntuples) {
    const factors = ntuplesList(ntuples.section, 'FACTOR');
    const symbols = ntuplesList(ntuples.section, 'SYMBOL') ?? [];
    const letters = form.split('');
    for (const letter of letters) {
      if (!symbols.some((symbol) => symbol.toUpperCase() === letter)) {
        throw new Rejection(`${context}: the data table uses the symbol ${letter}, which ##SYMBOL= does not declare`);
      }
    }
    const index = (letter: string) => symbols.findIndex((symbol) => symbol.toUpperCase() === letter);
    const factorOf = (letter: string): number => {
      const text = factors?.[index(letter)] ?? '';
      const parsed = parseJcampNumber(text);
      if (!parsed.ok) throw new Rejection(`line ${ntuplesRecord(ntuples.section, 'FACTOR')!.line}: ##FACTOR= ${parsed.error}`);
      if (parsed.value === 0) throw new Rejection(`line ${ntuplesRecord(ntuples.section, 'FACTOR')!.line}: ##FACTOR= must not be zero`);
      return parsed.value ?? 1;
    };
    xFactor = factorOf('X');
    yFactor = factorOf('Y');
  } else {
    xFactor = factor(headers, 'XFACTOR', context);
    yFactor = factor(headers, 'YFACTOR', context);
  }
  const dataLines = record.lines;
  const parsed = parsePeakTable(dataLines, record.lineNumbers, form);
  if (!parsed.ok) throw new Rejection(parsed.error);
  const nPoints = headerNumber(headers, 'NPOINTS', false, context);
  if (nPoints !== null && nPoints !== parsed.x.length) {
    throw new Rejection(`${context}: ##NPOINTS= says ${nPoints} peaks but the table holds ${parsed.x.length}`);
  }
  if (parsed.x.length > limits.maxPeaks) {
    throw new Rejection(`${context}: ${parsed.x.length} peaks is more than the limit of ${limits.maxPeaks} in one spectrum`);
  }

  // jcampconverter reads XYW tables as pairs outside NTUPLES and fails on
  // undeclared symbols inside, so it is given the XY projection of the table
  const converterLines =
    form === 'XY'
      ? dataLines.map((line) => line.replace(/;/g, ' '))
      : parsed.x.map((xValue, i) => `${fmt(xValue)}, ${fmt(parsed.y[i])}`);
  const converterText = ntuples
    ? miniDocument([
        `##NTUPLES=${recordValue(ntuples.section.start)}`,
        ...ntuples.section.header
          .filter((r) => ['VARNAME', 'SYMBOL', 'VARTYPE', 'VARFORM', 'UNITS', 'FACTOR'].includes(r.canon))
          .map((r) => `##${r.canon}=${recordValue(r).replace(/\n/g, ' ')}`),
        `##PAGE=${recordValue(ntuples.page.page)}`,
        '##DATATABLE=(XY..XY), PEAKS',
        ...converterLines,
        '##ENDNTUPLES=',
      ])
    : miniDocument([`##XFACTOR=${xFactor}`, `##YFACTOR=${yFactor}`, '##PEAKTABLE=(XY..XY)', ...converterLines]);
  const pairs = parsed.x.length;
  const converted = pairs > 0 ? convertOne(converterText, record) : { data: { x: [], y: [] } };
  const cx = converted.data?.x ?? [];
  const cy = converted.data?.y ?? [];
  if (cx.length !== pairs) {
    throw new Rejection(
      `${context}: the table reads as ${pairs} peaks line by line but as ${cx.length} with jcampconverter; the table is ambiguous`,
    );
  }

  const peaks: Peak[] = [];
  let missing = 0;
  for (let i = 0; i < pairs; i++) {
    if (Number.isNaN(parsed.x[i]) || Number.isNaN(parsed.y[i])) {
      missing++;
      continue;
    }
    const mz = finiteOrReject(parsed.x[i] * xFactor, `${context}: an m/z times its factor is not finite`);
    const intensity = finiteOrReject(parsed.y[i] * yFactor, `${context}: an intensity times its factor is not finite`);
    if (Math.abs(cx[i] - mz) > 1e-9 * Math.max(1, Math.abs(mz)) || Math.abs(cy[i] - intensity) > 1e-9 * Math.max(1, Math.abs(intensity))) {
      throw new Rejection(
        `${context}: peak ${i + 1} reads as (${mz}, ${intensity}) line by line but as (${cx[i]}, ${cy[i]}) with jcampconverter`,
      );
    }
    if (!(mz > 0)) throw new Rejection(`${context}: m/z ${mz} is not positive`);
    if (intensity < 0) throw new Rejection(`${context}: negative intensity ${intensity} at m/z ${mz}`);
    if (intensity === 0) continue;
    peaks.push([mz, intensity]);
  }
  if (missing > 0) warn('missing_value', `${context}: ${missing} peak(s) with a missing value ("?") skipped`);
  return finishPeaks(peaks, context, limits, warn);
}

function fmt(value: number): string {
  return Number.isNaN(value) ? '?' : String(value);
}

/** Sort by m/z, merge equal m/z, enforce the peak limit. */
function finishPeaks(peaks: Peak[], context: string, limits: Limits, warn: (code: string, message: string) => void): Peak[] {
  if (peaks.length > limits.maxPeaks) {
    throw new Rejection(`${context} ${peaks.length} peaks is more than the limit of ${limits.maxPeaks} in one spectrum`);
  }
  const sorted = peaks.slice().sort((a, b) => a[0] - b[0]);
  const merged: Peak[] = [];
  let duplicates = 0;
  for (const peak of sorted) {
    const last = merged.at(-1);
    if (last && last[0] === peak[0]) {
      last[1] += peak[1];
      duplicates++;
    } else {
      merged.push([peak[0], peak[1]]);
    }
  }
  if (duplicates > 0) warn('duplicate_mz', `${context} ${duplicates} repeated m/z value(s) merged by adding their intensities`);
  return merged;
}

// ---------------------------------------------------------------- NTUPLES

function ntuplesRecord(section: NtuplesSection, canon: string): LabeledRecord | undefined {
  return section.header.find((record) => record.canon === canon);
}

function ntuplesList(section: NtuplesSection, canon: string): string[] | null {
  const record = ntuplesRecord(section, canon);
  if (!record) return null;
  return recordValue(record).replace(/\n/g, ' ').split(',').map((item) => item.trim());
}

function readNtuples(
  block: ScannedBlock,
  section: NtuplesSection,
  limits: Limits,
  warn: (code: string, message: string) => void,
): ParsedSpectrum[] {
  const context = `line ${section.start.line}: ##NTUPLES=`;
  const symbols = ntuplesList(section, 'SYMBOL');
  if (!symbols) throw new Rejection(`${context} the section has no ##SYMBOL=`);
  if (section.pages.length === 0) throw new Rejection(`${context} the section has no ##PAGE=`);
  const names = ntuplesList(section, 'VARNAME') ?? [];
  const units = ntuplesList(section, 'UNITS') ?? [];
  const dims = ntuplesList(section, 'VARDIM') ?? [];
  const spectra: ParsedSpectrum[] = [];
  section.pages.forEach((page, p) => {
    const pageText = recordValue(page.page);
    const eq = pageText.indexOf('=');
    const pageSymbol = eq === -1 ? '' : pageText.slice(0, eq).trim();
    const pageValue = parseLeadingNumber(eq === -1 ? pageText : pageText.slice(eq + 1));
    const symbolIndex = symbols.findIndex((symbol) => symbol.toUpperCase() === pageSymbol.toUpperCase());
    const pageVariable = `${names[symbolIndex] ?? ''} ${units[symbolIndex] ?? ''}`.toUpperCase();
    const isTime = symbolIndex !== -1 && /TIME|SECOND|MINUTE/.test(pageVariable);
    const table = page.records.find((record) => record.canon === 'DATATABLE');
    if (!table) throw new Rejection(`line ${page.page.line}: page ${shorten(pageText)} has no ##DATA TABLE=`);
    const match = /^(.*\))\s*,?\s*([A-Za-z]+)?\s*$/.exec(table.head);
    const descriptor = match ? match[1] : table.head;
    const kind = (match?.[2] ?? '').toUpperCase();
    if (kind !== 'PEAKS') {
      throw new Rejection(
        `line ${table.line}: NTUPLES pages must hold peak tables ("(XY..XY), PEAKS"); "${shorten(table.head)}" is not supported`,
      );
    }
    const peaks = readPeakTableRecord(table, page.records, { section, page, descriptor }, limits, warn);
    const metadata = readMetadata(block, [...page.records, ...section.header, section.start], warn);
    const pageTime = page.records.find((r) => r.canon === 'RETENTIONTIME' || r.canon === '.RETENTIONTIME');
    const retentionTime = pageTime
      ? parseLeadingNumber(recordValue(pageTime))
      : isTime && pageValue !== null
        ? pageValue
        : metadata.retentionTime;
    spectra.push({
      ...metadata,
      retentionTime,
      page: p + 1,
      peaks,
      dataForm: 'ntuples',
    });
  });
  const pageSymbol = recordValue(section.pages[0].page).split('=')[0].trim().toUpperCase();
  const pageIndex = symbols.findIndex((symbol) => symbol.toUpperCase() === pageSymbol);
  const statedPages = pageIndex === -1 ? null : parseLeadingNumber(dims[pageIndex] ?? '');
  if (statedPages !== null && statedPages !== section.pages.length) {
    warn('page_count', `${context} ##VAR_DIM= gives ${statedPages} pages but the section holds ${section.pages.length}`);
  }
  return spectra;
}

function compact(text: string): string {
  return text.replace(/\s+/g, '').toUpperCase();
}
