/**
 * Whether a CAS Registry Number's check digit is right. The check digit is the
 * sum of the other digits, each times its position counted from the right
 * (starting at 1), modulo 10 (CAS's published check-digit rule; e.g. 7732-18-5).
 * @param cas - e.g. "71-43-2"; surrounding blanks are ignored.
 * @returns false when the text is not of the form NNNNNNN-NN-N or the digit is wrong.
 */
export function casCheckDigitValid(cas: string): boolean {
  if (typeof cas !== 'string') return false;
  const match = /^(\d{2,7})-(\d{2})-(\d)$/.exec(cas.trim());
  if (!match) return false;
  const digits = match[1] + match[2];
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    sum += Number(digits[digits.length - 1 - i]) * (i + 1);
  }
  return sum % 10 === Number(match[3]);
}
