/**
 * The key that makes two spellings of a compound name the same compound for
 * duplicate detection: Unicode-compatibility form, lower case, runs of blanks
 * as one blank, trimmed; at most 255 characters (the column's width).
 */
export function compoundNameKey(name: string): string {
  return name.normalize('NFKC').toLowerCase().replace(/\s+/g, ' ').trim().slice(0, 255);
}
