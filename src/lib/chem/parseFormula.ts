import { MF } from 'mf-parser';

import { FormulaError } from './FormulaError';
import { hillAtoms, type FormulaAtom } from './hillAtoms';
import { toHill } from './toHill';
import type { ElementCounts } from './types';

export type { FormulaAtom };

export interface ParsedFormula {
  /** the text as given */
  input: string;
  /** Hill-order formula: C, then H, then the others alphabetically (all alphabetical without C) */
  hill: string;
  /** atom counts per element, isotopic labels merged into their element */
  elements: ElementCounts;
  /** isotopically labelled atoms, e.g. `{ '2H': 8 }` for toluene-d8 */
  labelledIsotopes: Record<string, number>;
  /** each element and label with its count, in Hill order */
  atoms: FormulaAtom[];
  /** net charge written in the formula, e.g. 1 for `C7H7(+)` */
  charge: number;
}

const BRACKETS: Record<string, string> = { ')': '(', ']': '[', '}': '{' };

function checkBrackets(mf: string): string | undefined {
  const stack: string[] = [];
  for (const ch of mf) {
    if (ch === '(' || ch === '[' || ch === '{') stack.push(ch);
    else if (ch in BRACKETS) {
      if (stack.pop() !== BRACKETS[ch]) return `unbalanced brackets: unexpected "${ch}"`;
    }
  }
  if (stack.length > 0) return `unbalanced brackets: "${stack.at(-1)}" is never closed`;
  return undefined;
}

/**
 * Reads a molecular formula with mf-parser and normalizes it to Hill order.
 * Accepts groups and brackets as mf-parser does (`CH3CH2OH`, `C6H5(CH3)`, `Ph`),
 * isotopic labels (`C7[2H]8`) and a charge in brackets (`C7H7(+)`).
 * @param mf - molecular formula
 * @throws {FormulaError} for an empty formula, an unknown element, unbalanced brackets,
 *   a negative count, ranges or other text mf-parser cannot read
 */
export function parseFormula(mf: string): ParsedFormula {
  if (typeof mf !== 'string' || mf.trim() === '') {
    throw new FormulaError('the formula is empty', 'empty', String(mf ?? ''));
  }
  const input = mf;
  const bracketProblem = checkBrackets(mf);
  if (bracketProblem) throw new FormulaError(`${bracketProblem} in ${mf}`, 'unbalanced_brackets', input);

  let parsed: MF;
  let info: { atoms: Record<string, number>; charge: number };
  let parts: ReturnType<MF['getElements']>;
  try {
    parsed = new MF(mf.trim());
    info = parsed.getInfo() as unknown as { atoms: Record<string, number>; charge: number };
    // getElements() does not accept charges: read the atoms of the neutral form
    parts = info.charge ? new MF(parsed.toNeutralMF()).getElements() : parsed.getElements();
  } catch (error) {
    const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
    const unknown = /Unknown element: ?(\S+)/i.exec(message);
    if (unknown) throw new FormulaError(`unknown element "${unknown[1]}" in ${mf}`, 'unknown_element', input);
    if (/parenthesis|bracket/i.test(message)) {
      throw new FormulaError(`unbalanced brackets in ${mf}`, 'unbalanced_brackets', input);
    }
    if (/range/i.test(message)) {
      throw new FormulaError(`ranges such as C1-3 are not a single formula: ${mf}`, 'unsupported', input);
    }
    throw new FormulaError(`cannot read the formula ${mf}: ${message}`, 'syntax', input);
  }

  const elements: ElementCounts = {};
  const labelledIsotopes: Record<string, number> = {};
  for (const part of parts) {
    if (!Number.isInteger(part.number)) {
      throw new FormulaError(`non-integer count ${part.number} for ${part.symbol} in ${mf}`, 'syntax', input);
    }
    elements[part.symbol] = (elements[part.symbol] ?? 0) + part.number;
    if (part.isotope) {
      const key = `${part.isotope}${part.symbol}`;
      labelledIsotopes[key] = (labelledIsotopes[key] ?? 0) + part.number;
    }
  }
  for (const [symbol, count] of [...Object.entries(elements), ...Object.entries(labelledIsotopes)]) {
    if (count < 0) throw new FormulaError(`negative count for ${symbol} in ${mf}`, 'negative_count', input);
  }
  for (const symbol of Object.keys(elements)) if (elements[symbol] === 0) delete elements[symbol];
  for (const key of Object.keys(labelledIsotopes)) if (labelledIsotopes[key] === 0) delete labelledIsotopes[key];
  if (Object.keys(elements).length === 0) {
    throw new FormulaError(`the formula ${mf} contains no atoms`, 'empty', input);
  }
  const atoms = hillAtoms(elements, labelledIsotopes);
  return {
    input,
    hill: toHill(elements, labelledIsotopes),
    elements,
    labelledIsotopes,
    atoms,
    charge: info.charge ?? 0,
  };
}
