import { canonicalLabel } from './canonicalLabel';

/** One labelled data record (LDR): `##LABEL= value` and the lines that follow it. */
export interface LabeledRecord {
  /** The label as written between `##` and `=`, trimmed. */
  label: string;
  /** The label as the standard compares it (see canonicalLabel). */
  canon: string;
  /** The rest of the label line after `=`, `$$` comment removed, trimmed. */
  head: string;
  /** The continuation lines, `$$` comments removed (not trimmed). */
  lines: string[];
  /** 1-based line numbers of `lines`. */
  lineNumbers: number[];
  /** 1-based line of the label. */
  line: number;
}

export interface NtuplesPage {
  /** The `##PAGE=` record. */
  page: LabeledRecord;
  records: LabeledRecord[];
}

export interface NtuplesSection {
  start: LabeledRecord;
  header: LabeledRecord[];
  pages: NtuplesPage[];
  end: LabeledRecord | null;
}

/** A block: from `##TITLE=` to its `##END=`; LINK blocks hold child blocks. */
export interface ScannedBlock {
  /** 0-based, in the order the `##TITLE=` lines appear. */
  index: number;
  title: string;
  line: number;
  records: LabeledRecord[];
  children: ScannedBlock[];
  parent: ScannedBlock | null;
  ntuples: NtuplesSection[];
  endLine: number | null;
}

export type ScanJcampResult =
  | { ok: true; blocks: ScannedBlock[]; notes: string[] }
  | { ok: false; error: string };

/** The full value of a record: head and continuation lines, trimmed. */
export function recordValue(record: LabeledRecord): string {
  return [record.head, ...record.lines.map((line) => line.trim())]
    .filter((part, i) => i === 0 || part !== '')
    .join('\n')
    .trim();
}

export function stripComment(line: string): string {
  const at = line.indexOf('$$');
  return at === -1 ? line : line.slice(0, at);
}

/**
 * A line-level scan of JCAMP-DX text into blocks, NTUPLES sections and
 * records, checking the structure that a lenient reader lets pass: the file
 * must start with `##TITLE=`, every label line needs `=`, every block its
 * `##END=`, every NTUPLES section its `##END NTUPLES=`, and a label may occur
 * only once in a block, an NTUPLES header or a page.
 * @param text - JCAMP-DX text with LF line ends.
 * @returns the blocks, or the first structural error.
 */
export function scanJcamp(text: string): ScanJcampResult {
  const rawLines = text.split('\n');
  const records: LabeledRecord[] = [];
  const notes: string[] = [];
  let current: LabeledRecord | null = null;
  let inCommentRecord = false;
  for (let i = 0; i < rawLines.length; i++) {
    const raw = rawLines[i];
    const lineNo = i + 1;
    const start = raw.trimStart();
    if (start.startsWith('##')) {
      const eq = start.indexOf('=');
      if (eq === -1) {
        return { ok: false, error: `line ${lineNo}: a label line without "=" (${shorten(start)})` };
      }
      const label = start.slice(2, eq).trim();
      const canon = canonicalLabel(label);
      if (canon === '' || label.startsWith('$$')) {
        // `##= text` is a comment record
        inCommentRecord = true;
        current = null;
        continue;
      }
      inCommentRecord = false;
      current = {
        label,
        canon,
        head: stripComment(start.slice(eq + 1)).trim(),
        lines: [],
        lineNumbers: [],
        line: lineNo,
      };
      records.push(current);
      continue;
    }
    if (inCommentRecord) continue;
    const content = stripComment(raw);
    if (current === null) {
      if (content.trim() !== '') {
        return {
          ok: false,
          error: 'not a JCAMP-DX file: it does not start with a ##TITLE= label',
        };
      }
      continue;
    }
    current.lines.push(content);
    current.lineNumbers.push(lineNo);
  }
  if (records.length === 0) {
    return { ok: false, error: 'not a JCAMP-DX file: no ##TITLE= label found' };
  }
  if (records[0].canon !== 'TITLE') {
    return {
      ok: false,
      error: `not a JCAMP-DX file: the first label is ##${records[0].label}=, not ##TITLE=`,
    };
  }

  const blocks: ScannedBlock[] = [];
  const stack: ScannedBlock[] = [];
  for (const record of records) {
    const block = stack.at(-1);
    const openNtuples = block?.ntuples.at(-1);
    const ntuplesOpen = openNtuples !== undefined && openNtuples.end === null;
    if (record.canon === 'TITLE') {
      if (block && ntuplesOpen) {
        return {
          ok: false,
          error: `line ${record.line}: ##TITLE= inside the NTUPLES section that starts at line ${openNtuples.start.line}, which has no ##END NTUPLES=`,
        };
      }
      const created: ScannedBlock = {
        index: blocks.length,
        title: recordValue(record),
        line: record.line,
        records: [record],
        children: [],
        parent: block ?? null,
        ntuples: [],
        endLine: null,
      };
      block?.children.push(created);
      blocks.push(created);
      stack.push(created);
      continue;
    }
    if (!block) {
      return {
        ok: false,
        error: `line ${record.line}: label ##${record.label}= after the last ##END=, outside any block`,
      };
    }
    if (record.canon === 'END') {
      if (ntuplesOpen) {
        return {
          ok: false,
          error: `the NTUPLES section that starts at line ${openNtuples.start.line} has no ##END NTUPLES= before ##END= at line ${record.line}`,
        };
      }
      block.endLine = record.line;
      stack.pop();
      if (record.lines.some((line) => line.trim() !== '')) {
        notes.push(`text after ##END= at line ${record.line} was ignored`);
      }
      continue;
    }
    if (ntuplesOpen) {
      if (record.canon === 'ENDNTUPLES') {
        openNtuples.end = record;
      } else if (record.canon === 'PAGE') {
        openNtuples.pages.push({ page: record, records: [] });
      } else if (record.canon === 'NTUPLES') {
        return {
          ok: false,
          error: `line ${record.line}: ##NTUPLES= inside the NTUPLES section that starts at line ${openNtuples.start.line}`,
        };
      } else {
        const page = openNtuples.pages.at(-1);
        (page ? page.records : openNtuples.header).push(record);
      }
      continue;
    }
    if (record.canon === 'ENDNTUPLES' || record.canon === 'PAGE') {
      return {
        ok: false,
        error: `line ${record.line}: ##${record.label}= outside an NTUPLES section`,
      };
    }
    if (record.canon === 'NTUPLES') {
      block.ntuples.push({ start: record, header: [], pages: [], end: null });
    }
    block.records.push(record);
  }
  const unclosed = stack.at(-1);
  if (unclosed) {
    const nt = unclosed.ntuples.at(-1);
    if (nt && nt.end === null) {
      return {
        ok: false,
        error: `the NTUPLES section that starts at line ${nt.start.line} has no ##END NTUPLES= (the file is truncated or incomplete)`,
      };
    }
    return {
      ok: false,
      error: `missing ##END= for the block "${shorten(unclosed.title)}" that starts at line ${unclosed.line} (the file is truncated or incomplete)`,
    };
  }

  for (const block of blocks) {
    const duplicate =
      findDuplicate(block.records) ??
      block.ntuples.map((nt) => findDuplicate(nt.header)).find(Boolean) ??
      block.ntuples
        .flatMap((nt) => nt.pages.map((page) => findDuplicate([page.page, ...page.records])))
        .find(Boolean);
    if (duplicate) {
      return {
        ok: false,
        error: `duplicate label ##${duplicate[1].label}= at lines ${duplicate[0].line} and ${duplicate[1].line} in the block "${shorten(block.title)}"`,
      };
    }
  }
  return { ok: true, blocks, notes };
}

function findDuplicate(records: LabeledRecord[]): [LabeledRecord, LabeledRecord] | undefined {
  const seen = new Map<string, LabeledRecord>();
  for (const record of records) {
    const first = seen.get(record.canon);
    if (first) return [first, record];
    seen.set(record.canon, record);
  }
  return undefined;
}

export function shorten(text: string, max = 60): string {
  const oneLine = text.replace(/\s+/g, ' ').trim();
  return oneLine.length > max ? `${oneLine.slice(0, max - 1)}…` : oneLine;
}
