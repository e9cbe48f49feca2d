// Tags: create, rename, recolour, merge, and assign in bulk. Tags classify
// records; they are not part of a version, so a change is audited but makes
// no new version. A change on a released record bumps the library version
// (searches filter by tag).
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { getSequelize } from '../db/sequelize';
import { getModels } from '../db/index';
import { appendAudit } from '../audit';
import { bumpLibraryVersion } from '../library-state';
import { HttpError } from '../http';
import type { Actor } from './types';

export const DEFAULT_TAG_COLOUR = '#2f6f73';
export const COLOUR_PATTERN = /^#[0-9a-fA-F]{6}$/;

type Row = Record<string, any>;

export interface TagView {
  id: number;
  name: string;
  colour: string;
  recordCount: number;
}

function normalizeTagName(name: string): string {
  return name.normalize('NFKC').replace(/\s+/g, ' ').trim();
}

export async function listTags(): Promise<TagView[]> {
  const rows = await getSequelize().query<Row>(
    'SELECT t.id, t.name, t.colour, COUNT(rt.recordId) AS n FROM tag t LEFT JOIN record_tag rt ON rt.tagId = t.id GROUP BY t.id, t.name, t.colour ORDER BY t.name',
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ id: Number(r.id), name: String(r.name), colour: String(r.colour), recordCount: Number(r.n) }));
}

async function tagByName(name: string, t?: Transaction): Promise<Row | null> {
  const [row] = await getSequelize().query<Row>('SELECT * FROM tag WHERE LOWER(name) = LOWER(?) LIMIT 1', {
    replacements: [name], type: QueryTypes.SELECT, transaction: t,
  });
  return row ?? null;
}

async function createTagIn(name: string, colour: string, actor: Actor, t: Transaction): Promise<TagView> {
  const now = new Date();
  const tag = await getModels().Tag.create({ name, colour, createdAt: now, updatedAt: now }, { transaction: t });
  const id = Number(tag.get('id'));
  await appendAudit({ actorId: actor.id, actorEmail: actor.email, action: 'tag.create', targetType: 'tag', targetId: id, details: { after: { name, colour } } }, t);
  return { id, name, colour, recordCount: 0 };
}

export async function createTag(input: { name: string; colour?: string }, actor: Actor): Promise<TagView> {
  const name = normalizeTagName(input.name);
  if (!name) throw new HttpError(400, 'invalid_input', 'name: a tag needs a name', [{ field: 'name', message: 'a tag needs a name' }]);
  const colour = (input.colour ?? DEFAULT_TAG_COLOUR).toLowerCase();
  if (!COLOUR_PATTERN.test(colour)) throw new HttpError(400, 'invalid_input', 'colour: use #rrggbb', [{ field: 'colour', message: 'use #rrggbb' }]);
  return getSequelize().transaction(async (t) => {
    if (await tagByName(name, t)) throw new HttpError(409, 'duplicate', `A tag "${name}" exists already`);
    return createTagIn(name, colour, actor, t);
  });
}

async function recordsOfTag(tagId: number, t: Transaction): Promise<{ recordId: number; released: boolean }[]> {
  const rows = await getSequelize().query<Row>(
    'SELECT rt.recordId, r.releasedVersion FROM record_tag rt JOIN spectrum_record r ON r.id = rt.recordId WHERE rt.tagId = ?',
    { replacements: [tagId], type: QueryTypes.SELECT, transaction: t },
  );
  return rows.map((r) => ({ recordId: Number(r.recordId), released: r.releasedVersion !== null }));
}

async function touchRecords(ids: number[], t: Transaction) {
  if (ids.length === 0) return;
  // the search index picks up changed records by their updatedAt
  await getModels().SpectrumRecord.update({ updatedAt: new Date() }, { where: { id: { [Op.in]: ids } }, transaction: t });
}

export async function updateTag(id: number, input: { name?: string; colour?: string }, actor: Actor): Promise<TagView> {
  return getSequelize().transaction(async (t) => {
    const [tag] = await getSequelize().query<Row>('SELECT * FROM tag WHERE id = ? FOR UPDATE', { replacements: [id], type: QueryTypes.SELECT, transaction: t });
    if (!tag) throw new HttpError(404, 'not_found', `There is no tag ${id}`);
    const before: Record<string, unknown> = {};
    const after: Record<string, unknown> = {};
    if (input.name !== undefined) {
      const name = normalizeTagName(input.name);
      if (!name) throw new HttpError(400, 'invalid_input', 'name: a tag needs a name', [{ field: 'name', message: 'a tag needs a name' }]);
      const other = await tagByName(name, t);
      if (other && Number(other.id) !== id) throw new HttpError(409, 'duplicate', `A tag "${name}" exists already; merge the two instead`);
      if (name !== tag.name) { before.name = tag.name; after.name = name; }
    }
    if (input.colour !== undefined) {
      const colour = input.colour.toLowerCase();
      if (!COLOUR_PATTERN.test(colour)) throw new HttpError(400, 'invalid_input', 'colour: use #rrggbb', [{ field: 'colour', message: 'use #rrggbb' }]);
      if (colour !== tag.colour) { before.colour = tag.colour; after.colour = colour; }
    }
    if (Object.keys(after).length > 0) {
      await getModels().Tag.update({ ...after, updatedAt: new Date() }, { where: { id }, transaction: t });
      await appendAudit({ actorId: actor.id, actorEmail: actor.email, action: after.name ? 'tag.rename' : 'tag.colour', targetType: 'tag', targetId: id, details: { before, after } }, t);
      if (after.name) {
        const recs = await recordsOfTag(id, t);
        await touchRecords(recs.map((r) => r.recordId), t);
        if (recs.some((r) => r.released)) await bumpLibraryVersion(t);
      }
    }
    const [n] = await getSequelize().query<Row>('SELECT COUNT(*) AS n FROM record_tag WHERE tagId = ?', { replacements: [id], type: QueryTypes.SELECT, transaction: t });
    return { id, name: String(after.name ?? tag.name), colour: String(after.colour ?? tag.colour), recordCount: Number(n.n) };
  });
}

/** Merge tag `id` into tag `into`: its records get `into`, and `id` is deleted. */
export async function mergeTag(id: number, into: number, actor: Actor): Promise<TagView> {
  if (id === into) throw new HttpError(400, 'invalid_input', 'into: a tag cannot be merged into itself', [{ field: 'into', message: 'choose another tag' }]);
  const sequelize = getSequelize();
  return sequelize.transaction(async (t) => {
    const tags = await sequelize.query<Row>('SELECT * FROM tag WHERE id IN (?, ?) FOR UPDATE', { replacements: [id, into], type: QueryTypes.SELECT, transaction: t });
    const from = tags.find((x) => Number(x.id) === id);
    const to = tags.find((x) => Number(x.id) === into);
    if (!from) throw new HttpError(404, 'not_found', `There is no tag ${id}`);
    if (!to) throw new HttpError(404, 'not_found', `There is no tag ${into}`);
    const recs = await recordsOfTag(id, t);
    await sequelize.query('INSERT IGNORE INTO record_tag (recordId, tagId) SELECT recordId, ? FROM record_tag WHERE tagId = ?', {
      replacements: [into, id], type: QueryTypes.INSERT, transaction: t,
    });
    await sequelize.query('DELETE FROM record_tag WHERE tagId = ?', { replacements: [id], type: QueryTypes.DELETE, transaction: t });
    await sequelize.query('DELETE FROM tag WHERE id = ?', { replacements: [id], type: QueryTypes.DELETE, transaction: t });
    await appendAudit({
      actorId: actor.id, actorEmail: actor.email, action: 'tag.merge', targetType: 'tag', targetId: into,
      details: { before: { tags: [from.name, to.name] }, after: { tags: [to.name] }, merged: { id, name: from.name }, into: { id: into, name: to.name }, records: recs.map((r) => r.recordId) },
    }, t);
    await touchRecords(recs.map((r) => r.recordId), t);
    if (recs.some((r) => r.released)) await bumpLibraryVersion(t);
    const [n] = await sequelize.query<Row>('SELECT COUNT(*) AS n FROM record_tag WHERE tagId = ?', { replacements: [into], type: QueryTypes.SELECT, transaction: t });
    return { id: into, name: String(to.name), colour: String(to.colour), recordCount: Number(n.n) };
  });
}

async function resolveTags(input: { tagIds?: number[]; tagNames?: string[] }, create: boolean, actor: Actor, t: Transaction): Promise<Row[]> {
  const sequelize = getSequelize();
  const out: Row[] = [];
  if (input.tagIds?.length) {
    const rows = await sequelize.query<Row>('SELECT * FROM tag WHERE id IN (?)', { replacements: [input.tagIds], type: QueryTypes.SELECT, transaction: t });
    const missing = input.tagIds.filter((id) => !rows.some((r) => Number(r.id) === id));
    if (missing.length) throw new HttpError(404, 'not_found', `There is no tag ${missing.join(', ')}`);
    out.push(...rows);
  }
  for (const raw of input.tagNames ?? []) {
    const name = normalizeTagName(raw);
    if (!name) continue;
    const found = await tagByName(name, t);
    if (found) out.push(found);
    else if (create) out.push(await createTagIn(name, DEFAULT_TAG_COLOUR, actor, t));
  }
  const seen = new Set<number>();
  return out.filter((r) => (seen.has(Number(r.id)) ? false : (seen.add(Number(r.id)), true)));
}

/** Bulk assign: add or remove tags on many records at once. */
export async function assignTags(
  input: { recordIds: number[]; tagIds?: number[]; tagNames?: string[]; action: 'add' | 'remove' },
  actor: Actor,
): Promise<{ recordIds: number[]; tags: string[]; action: string; changed: number }> {
  const sequelize = getSequelize();
  const recordIds = [...new Set(input.recordIds)];
  return sequelize.transaction(async (t) => {
    const records = await sequelize.query<Row>('SELECT id, releasedVersion FROM spectrum_record WHERE id IN (?) FOR UPDATE', {
      replacements: [recordIds], type: QueryTypes.SELECT, transaction: t,
    });
    const missing = recordIds.filter((id) => !records.some((r) => Number(r.id) === id));
    if (missing.length) throw new HttpError(404, 'not_found', `There is no record ${missing.slice(0, 10).join(', ')}`);
    const tags = await resolveTags(input, input.action === 'add', actor, t);
    if (tags.length === 0) throw new HttpError(400, 'invalid_input', 'tagIds: name at least one tag', [{ field: 'tagIds', message: 'name at least one tag' }]);
    const existing = await sequelize.query<Row>('SELECT recordId, tagId FROM record_tag WHERE recordId IN (?) AND tagId IN (?)', {
      replacements: [recordIds, tags.map((x) => Number(x.id))], type: QueryTypes.SELECT, transaction: t,
    });
    const has = new Set(existing.map((r) => `${r.recordId}:${r.tagId}`));
    const changes: { recordId: number; tag: string }[] = [];
    for (const rid of recordIds) {
      for (const tag of tags) {
        const key = `${rid}:${tag.id}`;
        if (input.action === 'add' && !has.has(key)) changes.push({ recordId: rid, tag: String(tag.name) });
        if (input.action === 'remove' && has.has(key)) changes.push({ recordId: rid, tag: String(tag.name) });
      }
    }
    if (changes.length > 0) {
      const tagIdByName = new Map(tags.map((x) => [String(x.name), Number(x.id)]));
      if (input.action === 'add') {
        await getModels().RecordTag.bulkCreate(changes.map((c) => ({ recordId: c.recordId, tagId: tagIdByName.get(c.tag)! })), { transaction: t });
      } else {
        for (const c of changes) {
          await sequelize.query('DELETE FROM record_tag WHERE recordId = ? AND tagId = ?', { replacements: [c.recordId, tagIdByName.get(c.tag)], type: QueryTypes.DELETE, transaction: t });
        }
      }
      const byRecord = new Map<number, string[]>();
      for (const c of changes) byRecord.set(c.recordId, [...(byRecord.get(c.recordId) ?? []), c.tag]);
      for (const [rid, names] of byRecord) {
        await appendAudit({
          actorId: actor.id, actorEmail: actor.email, action: input.action === 'add' ? 'record.tag_add' : 'record.tag_remove',
          targetType: 'spectrum_record', targetId: rid, recordId: rid,
          details: input.action === 'add' ? { before: { tags: [] }, after: { tags: names } } : { before: { tags: names }, after: { tags: [] } },
        }, t);
      }
      await touchRecords([...byRecord.keys()], t);
      if (records.some((r) => r.releasedVersion !== null && byRecord.has(Number(r.id)))) await bumpLibraryVersion(t);
    }
    return { recordIds, tags: tags.map((x) => String(x.name)), action: input.action, changed: changes.length };
  });
}

/** Set a record's tags to exactly these names (creating tags that do not exist); for PATCH. */
export async function setRecordTags(recordId: number, names: string[], actor: Actor, t: Transaction, reason: string | null = null) {
  const sequelize = getSequelize();
  const current = await sequelize.query<Row>('SELECT t.id, t.name FROM record_tag rt JOIN tag t ON t.id = rt.tagId WHERE rt.recordId = ? ORDER BY t.name', {
    replacements: [recordId], type: QueryTypes.SELECT, transaction: t,
  });
  const wanted = await resolveTags({ tagNames: names }, true, actor, t);
  const currentIds = new Set(current.map((r) => Number(r.id)));
  const wantedIds = new Set(wanted.map((r) => Number(r.id)));
  const add = wanted.filter((r) => !currentIds.has(Number(r.id)));
  const remove = current.filter((r) => !wantedIds.has(Number(r.id)));
  if (add.length) await getModels().RecordTag.bulkCreate(add.map((r) => ({ recordId, tagId: Number(r.id) })), { transaction: t });
  for (const r of remove) {
    await sequelize.query('DELETE FROM record_tag WHERE recordId = ? AND tagId = ?', { replacements: [recordId, r.id], type: QueryTypes.DELETE, transaction: t });
  }
  const changed = add.length + remove.length > 0;
  if (changed) {
    await appendAudit({
      actorId: actor.id, actorEmail: actor.email, action: 'record.tags', targetType: 'spectrum_record', targetId: recordId, recordId, reason,
      details: { before: { tags: current.map((r) => String(r.name)) }, after: { tags: wanted.map((r) => String(r.name)).sort() } },
    }, t);
    await touchRecords([recordId], t);
  }
  return { tags: wanted.map((r) => String(r.name)).sort(), changed };
}
