/**
 * The form in which JCAMP-DX labels are compared: the standard ignores case,
 * spaces, '-', '/' and '_' (McDonald and Wilks, Appl. Spectrosc. 42 (1988) 151).
 * `##X_FACTOR`, `##x factor` and `##XFACTOR` are the same label.
 * @param label - the label between `##` and `=`.
 * @returns the label in upper case without those characters.
 */
export function canonicalLabel(label: string): string {
  return label.replace(/[\s\-/_]/g, '').toUpperCase();
}
