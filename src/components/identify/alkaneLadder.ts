// The small n-alkane-ladder calculator of the RI filter: "C10 6.42" a line.
import { retentionIndex, type AlkaneStandard } from '../../lib/chem/retentionIndex';

export interface LadderParse {
  ladder: AlkaneStandard[];
  errors: { line: number; message: string }[];
}

/** Read ladder lines such as "C10 6.42", "10 6.42" or "C10: 6.42" (carbon number, retention time). */
export function parseAlkaneLadder(text: string): LadderParse {
  const ladder: AlkaneStandard[] = [];
  const errors: LadderParse['errors'] = [];
  String(text ?? '')
    .split(/\r\n|\r|\n/)
    .forEach((raw, i) => {
      const line = raw.trim();
      if (line === '') return;
      const m = /^[Cc]?\s*(\d+)\s*[:=,;\s]\s*([+-]?\d+(?:\.\d+)?)\s*(?:min)?$/.exec(line);
      if (!m) {
        errors.push({ line: i + 1, message: `"${line}" is not "C<carbons> <retention time>"` });
        return;
      }
      ladder.push({ carbons: Number(m[1]), rt: Number(m[2]) });
    });
  return { ladder, errors };
}

/** The RI of a retention time on the ladder text, or the reason it cannot be computed. */
export function riFromLadderText(rt: number, text: string): { ri: number } | { error: string } {
  const { ladder, errors } = parseAlkaneLadder(text);
  if (errors.length > 0) return { error: `ladder line ${errors[0].line}: ${errors[0].message}` };
  try {
    return { ri: retentionIndex(rt, ladder) };
  } catch (e) {
    return { error: (e as Error).message };
  }
}
