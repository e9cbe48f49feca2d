/**
 * Remove the spacing JCAMP-DX allows in MOLFORM ("C 6 H 6" -> "C6H6",
 * "C 7 H 5 Cl 1 O" -> "C7H5ClO"). Element order is left as written; Hill
 * order is the chemistry layer's job. Text that is not a plain list of
 * element symbols and counts only loses its blanks.
 * @param molform - the MOLFORM value.
 * @returns the formula, or null when empty.
 */
export function normalizeFormula(molform: string): string | null {
  const compact = molform.replace(/\s+/g, '');
  if (compact === '' || compact === '?') return null;
  const plain = /^(?:[A-Z][a-z]?\d*)+$/;
  if (!plain.test(compact)) return compact;
  // tokenise on the spaced form so that "C 1 H 4" is read as C1 H4, then drop counts of 1
  const tokens = molform.trim().match(/[A-Z][a-z]?\s*\d*/g) ?? [];
  return tokens
    .map((token) => {
      const m = /^([A-Z][a-z]?)\s*(\d*)$/.exec(token);
      if (!m) return token.replace(/\s+/g, '');
      return m[2] === '1' ? m[1] : m[1] + m[2];
    })
    .join('');
}
