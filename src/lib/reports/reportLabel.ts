/** The report id as people quote it: IR-00012 ("identification report"). */
export function reportLabel(id: number): string {
  if (!Number.isInteger(id) || id < 1) throw new RangeError('id must be a positive integer');
  return `IR-${String(id).padStart(5, '0')}`;
}
