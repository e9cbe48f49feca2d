// The SQL WHERE clause of a library listing: which version of each record is
// "current" for the asked statuses, and the metadata filters. Pure: returns
// SQL text and positional replacements, for the caller to run.
import { parseFormula } from '../chem/parseFormula';
import { HttpError } from '../http';
import type { RecordStatus, SpectraListQuery } from './listQuery';

export interface WhereClause {
  sql: string;
  params: unknown[];
}

/**
 * The current version of each record among `statuses` is its newest version in
 * one of them: with the default (`released`) that is the released version; a
 * curator asking for drafts sees a record's newest draft instead.
 * @param query - the parsed list query (`q` is handled elsewhere, by the name index)
 * @param statuses - statuses to list; empty means `['released']`
 * @param alias - the alias of spectrum_version in the caller's SQL
 */
export function buildListWhere(query: Omit<SpectraListQuery, 'page' | 'pageSize' | 'sort' | 'q'>, statuses: RecordStatus[], alias = 'v'): WhereClause {
  const v = alias;
  const wanted = statuses.length > 0 ? statuses : (['released'] as RecordStatus[]);
  const parts: string[] = [
    `${v}.status IN (?)`,
    `${v}.version = (SELECT MAX(cv.version) FROM spectrum_version cv WHERE cv.recordId = ${v}.recordId AND cv.status IN (?))`,
  ];
  const params: unknown[] = [wanted, wanted];

  if (query.formula) {
    let hill: string;
    try {
      hill = parseFormula(query.formula).hill;
    } catch (e) {
      throw new HttpError(400, 'invalid_input', `formula: ${(e as Error).message}`);
    }
    parts.push(`${v}.formula IN (?)`);
    params.push([...new Set([hill, query.formula.replace(/\s+/g, '')])]);
  }
  for (const el of query.elements ?? []) {
    parts.push(`FIND_IN_SET(?, ${v}.elements) > 0`);
    params.push(el);
  }
  for (const el of query.excludeElements ?? []) {
    parts.push(`(${v}.elements IS NULL OR FIND_IN_SET(?, ${v}.elements) = 0)`);
    params.push(el);
  }
  if (query.ihdMin !== undefined) {
    parts.push(`${v}.ihd >= ?`);
    params.push(query.ihdMin);
  }
  if (query.ihdMax !== undefined) {
    parts.push(`${v}.ihd <= ?`);
    params.push(query.ihdMax);
  }
  if (query.massMin !== undefined) {
    parts.push(`${v}.nominalMass >= ?`);
    params.push(query.massMin);
  }
  if (query.massMax !== undefined) {
    parts.push(`${v}.nominalMass <= ?`);
    params.push(query.massMax);
  }
  for (const tag of query.tags ?? []) {
    // Tag names compare without regard to case: the column's binary collation would not.
    parts.push(`EXISTS (SELECT 1 FROM record_tag rt JOIN tag t ON t.id = rt.tagId WHERE rt.recordId = ${v}.recordId AND LOWER(t.name) = LOWER(?))`);
    params.push(tag);
  }
  if (query.ids && query.ids.length > 0) {
    parts.push(`${v}.recordId IN (?)`);
    params.push(query.ids);
  }
  if (query.synthetic === 'yes') parts.push(`${v}.synthetic = 1`);
  if (query.synthetic === 'no') parts.push(`${v}.synthetic = 0`);
  return { sql: parts.join(' AND '), params };
}
