const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

export type ParsedNumber = { ok: true; value: number | null } | { ok: false; error: string };

/**
 * Read a numeric label value strictly: empty or `?` is missing (null);
 * anything else must be one finite number (an AFFN value).
 * @param text - the value.
 * @returns the number, null, or why it is not a number.
 */
export function parseJcampNumber(text: string): ParsedNumber {
  const value = text.trim();
  if (value === '' || value === '?') return { ok: true, value: null };
  if (!NUMBER.test(value)) return { ok: false, error: `"${value}" is not a number` };
  const number = Number(value);
  if (!Number.isFinite(number)) return { ok: false, error: `"${value}" is not a finite number` };
  return { ok: true, value: number };
}

/**
 * The number a free-text value starts with ("70 eV" -> 70, "1234 (DB-5)" -> 1234).
 * @param text - the value.
 * @returns the number, or null when the value does not start with one.
 */
export function parseLeadingNumber(text: string): number | null {
  const match = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)/.exec(text);
  if (!match) return null;
  const number = Number(match[1]);
  return Number.isFinite(number) ? number : null;
}
