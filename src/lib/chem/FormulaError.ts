export type FormulaErrorCode =
  | 'empty'
  | 'unknown_element'
  | 'unbalanced_brackets'
  | 'negative_count'
  | 'unsupported'
  | 'syntax';

/** A molecular formula that cannot be read; `code` says why, `message` says it in words. */
export class FormulaError extends Error {
  readonly code: FormulaErrorCode;
  readonly formula: string;

  constructor(message: string, code: FormulaErrorCode, formula: string) {
    super(message);
    this.name = 'FormulaError';
    this.code = code;
    this.formula = formula;
  }
}
