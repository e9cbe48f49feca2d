export interface ValidateFileNameOptions {
  /**
   * Longest accepted name, in characters.
   * @default 255
   */
  maxLength?: number;
}

/**
 * Check an uploaded file's name before it is used in a report or on disk.
 * Rejects path separators ('/', '\\'), control characters, '.' and '..',
 * empty and overlong names.
 * @param fileName - the name as the client sent it.
 * @param options - limits.
 * @returns `{ ok: true }` or `{ ok: false, error }` saying why.
 */
export function validateFileName(
  fileName: string,
  options: ValidateFileNameOptions = {},
): { ok: true } | { ok: false; error: string } {
  const { maxLength = 255 } = options;
  if (!Number.isInteger(maxLength) || maxLength < 1) {
    throw new RangeError('maxLength must be a positive integer');
  }
  if (typeof fileName !== 'string' || fileName.length === 0) {
    return { ok: false, error: 'the file name is empty' };
  }
  if (fileName.length > maxLength) {
    return { ok: false, error: `the file name is longer than ${maxLength} characters` };
  }
  if (/[/\\]/.test(fileName)) {
    return { ok: false, error: 'the file name contains a path separator ("/" or "\\")' };
  }
  // C0 controls, DEL and C1 controls
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f\u007f-\u009f]/.test(fileName)) {
    return { ok: false, error: 'the file name contains a control character' };
  }
  if (fileName === '.' || fileName === '..') {
    return { ok: false, error: `the file name "${fileName}" is not a file` };
  }
  if (fileName.trim() === '') {
    return { ok: false, error: 'the file name is blank' };
  }
  return { ok: true };
}
