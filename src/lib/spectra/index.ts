export type { DataForm, ParsedSpectrum, Peak, ReadJcampResult, ReadWarning } from './types';
export { canonicalLabel } from './canonicalLabel';
export { casCheckDigitValid } from './casCheckDigitValid';
export { centroidProfile, type CentroidProfileOptions } from './centroidProfile';
export { checkXyLineStarts } from './checkXyLineStarts';
export { decodePeaks } from './decodePeaks';
export { decodeText, normalizeLineEnds } from './decodeText';
export { decodeXyData, type DecodeXyDataOptions, type DecodeXyDataResult, type XyLineStart } from './decodeXyData';
export { encodePeaks, PACKED_PEAKS_MAGIC } from './encodePeaks';
export { normalizeFormula } from './normalizeFormula';
export { normalizePeaksForHash, type NormalizePeaksForHashOptions } from './normalizePeaksForHash';
export { parseJcampNumber, parseLeadingNumber, type ParsedNumber } from './parseJcampNumber';
export { parsePeakTable, type ParsePeakTableResult, type PeakTableForm } from './parsePeakTable';
export { peakContentHash } from './peakContentHash';
export { readJcamp, type ReadJcampOptions } from './readJcamp';
export {
  scanJcamp,
  recordValue,
  type LabeledRecord,
  type NtuplesPage,
  type NtuplesSection,
  type ScanJcampResult,
  type ScannedBlock,
} from './scanJcamp';
export { tokenizeAsdfLine, type AsdfToken, type TokenizeAsdfLineResult } from './tokenizeAsdfLine';
export { validateFileName, type ValidateFileNameOptions } from './validateFileName';
export { writeJcamp, type JcampSpectrumInput, type WriteJcampOptions } from './writeJcamp';
