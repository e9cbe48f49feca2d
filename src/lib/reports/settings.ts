// The lab's named, versioned settings (admin): 'search-defaults' and
// 'acceptance-criteria'. Each change is a new version row; old versions stay
// so that a report can say which criteria it was evaluated against.
import { QueryTypes, type Transaction } from 'sequelize';
import { z } from 'zod';
import { getSequelize } from '../db/sequelize';
import { appendAudit } from '../audit';
import { HttpError } from '../http';
import { BUILT_IN_SEARCH_DEFAULTS, clearSearchDefaultsCache } from '../query/search-defaults';
import { SCORE_NAMES } from '../query/schemas';
import type { AcceptanceCriteria, Actor } from './types';

export const DEFAULT_ACCEPTANCE_CRITERIA: AcceptanceCriteria = {
  minimumScore: 0.8,
  riWindow: 20,
  keyIonCount: 5,
  keyIonTolerance: 0.2,
  isomerMargin: 0.02,
};

export const acceptanceCriteriaSchema = z
  .object({
    minimumScore: z.number().finite().min(0, 'must be 0..1').max(1, 'must be 0..1'),
    riWindow: z.number().finite().gt(0, 'must be above 0').max(2000, 'must be at most 2000'),
    keyIonCount: z.number().int('must be a whole number').min(1, 'must be 1..50').max(50, 'must be 1..50'),
    keyIonTolerance: z.number().finite().min(0, 'must be 0..1').max(1, 'must be 0..1'),
    isomerMargin: z.number().finite().min(0, 'must be 0..1').max(1, 'must be 0..1'),
  })
  .strict();

export const searchDefaultsSchema = z
  .object({
    rankBy: z.enum(SCORE_NAMES),
    weights: z.object({ mz: z.number().finite().min(0).max(6), intensity: z.number().finite().gt(0).max(3) }).strict(),
    lowMassCutoff: z.number().finite().min(0).max(5000).optional(),
    excludeIons: z.array(z.number().finite().gt(0).max(5000)).max(500).optional(),
    limit: z.number().int().min(1).max(500),
  })
  .strict();

export const SETTING_NAMES = ['search-defaults', 'acceptance-criteria'] as const;
export type SettingName = (typeof SETTING_NAMES)[number];

const SCHEMAS: Record<SettingName, z.ZodTypeAny> = {
  'search-defaults': searchDefaultsSchema,
  'acceptance-criteria': acceptanceCriteriaSchema,
};
const DEFAULTS: Record<SettingName, unknown> = {
  'search-defaults': BUILT_IN_SEARCH_DEFAULTS,
  'acceptance-criteria': DEFAULT_ACCEPTANCE_CRITERIA,
};

export const putSettingSchema = z.discriminatedUnion('name', [
  z.object({ name: z.literal('search-defaults'), value: searchDefaultsSchema, reason: z.string().max(2000).optional() }).strict(),
  z.object({ name: z.literal('acceptance-criteria'), value: acceptanceCriteriaSchema, reason: z.string().max(2000).optional() }).strict(),
]);

export interface SettingVersion {
  version: number;
  value: unknown;
  createdBy: { id: string; name: string } | null;
  createdAt: string;
}

function parseJson(v: unknown): unknown {
  if (typeof v !== 'string') return v;
  try {
    return JSON.parse(v);
  } catch {
    return null;
  }
}

/**
 * A stored criteria value in the form PUT writes, also reading the nested
 * form the demo seed wrote first ({ minScore, keyIons: { count, tolerance } }).
 */
export function normalizeCriteriaValue(v: unknown): Record<string, unknown> {
  if (!v || typeof v !== 'object') return {};
  const o = v as Record<string, any>;
  const out: Record<string, unknown> = { ...o };
  if (out.minimumScore === undefined && o.minScore !== undefined) out.minimumScore = o.minScore;
  if (o.keyIons && typeof o.keyIons === 'object') {
    if (out.keyIonCount === undefined) out.keyIonCount = o.keyIons.count;
    if (out.keyIonTolerance === undefined) out.keyIonTolerance = o.keyIons.tolerance;
  }
  return out;
}

/** The acceptance criteria in force: the newest version, filled up with the defaults; version null when none was ever set. */
export async function getAcceptanceCriteria(transaction?: Transaction): Promise<{ version: number | null; value: AcceptanceCriteria }> {
  const [row] = await getSequelize().query<{ version: number; value: unknown }>(
    "SELECT version, value FROM setting WHERE name = 'acceptance-criteria' ORDER BY version DESC LIMIT 1",
    { type: QueryTypes.SELECT, transaction },
  );
  if (!row) return { version: null, value: { ...DEFAULT_ACCEPTANCE_CRITERIA } };
  const stored = normalizeCriteriaValue(parseJson(row.value));
  const merged: Record<string, unknown> = { ...DEFAULT_ACCEPTANCE_CRITERIA };
  // Keep only well-formed values of known keys, so a hand-edited row cannot break evaluation.
  for (const k of Object.keys(DEFAULT_ACCEPTANCE_CRITERIA)) {
    const v = stored[k];
    if (typeof v === 'number' && Number.isFinite(v)) merged[k] = v;
  }
  const parsed = acceptanceCriteriaSchema.safeParse(merged);
  return { version: Number(row.version), value: parsed.success ? parsed.data : { ...DEFAULT_ACCEPTANCE_CRITERIA } };
}

/** Every version of both settings, newest first, with the value in force. */
export async function listSettings() {
  const s = getSequelize();
  const rows = await s.query<Record<string, any>>(
    `SELECT st.name, st.version, st.value, st.createdBy, st.createdAt, u.name AS creatorName
       FROM setting st LEFT JOIN \`user\` u ON u.id = st.createdBy
      WHERE st.name IN (?) ORDER BY st.name, st.version DESC`,
    { replacements: [SETTING_NAMES], type: QueryTypes.SELECT },
  );
  const out: Record<string, { name: SettingName; version: number | null; value: unknown; defaults: unknown; history: SettingVersion[] }> = {};
  for (const name of SETTING_NAMES) {
    const history: SettingVersion[] = rows
      .filter((r) => r.name === name)
      .map((r) => ({
        version: Number(r.version),
        value: parseJson(r.value),
        createdBy: r.createdBy ? { id: String(r.createdBy), name: String(r.creatorName ?? r.createdBy) } : null,
        createdAt: new Date(r.createdAt).toISOString(),
      }));
    const current = history[0];
    const value = name === 'acceptance-criteria'
      ? (await getAcceptanceCriteria()).value
      : { ...(DEFAULTS[name] as object), ...((current?.value as object) ?? {}) };
    out[name] = { name, version: current?.version ?? null, value, defaults: DEFAULTS[name], history };
  }
  return out;
}

/** Store a new version of a setting, audited in the same transaction. */
export async function putSetting(input: z.infer<typeof putSettingSchema>, actor: Actor): Promise<SettingVersion & { name: SettingName }> {
  const value = SCHEMAS[input.name].parse(input.value);
  const s = getSequelize();
  let result: SettingVersion & { name: SettingName };
  try {
    result = await s.transaction(async (t) => {
      const [prev] = await s.query<{ version: number; value: unknown }>(
        'SELECT version, value FROM setting WHERE name = ? ORDER BY version DESC LIMIT 1 FOR UPDATE',
        { replacements: [input.name], type: QueryTypes.SELECT, transaction: t },
      );
      const version = (prev ? Number(prev.version) : 0) + 1;
      const createdAt = new Date();
      await s.query('INSERT INTO setting (name, version, value, createdBy, createdAt) VALUES (?,?,?,?,?)', {
        replacements: [input.name, version, JSON.stringify(value), actor.id, createdAt],
        type: QueryTypes.INSERT,
        transaction: t,
      });
      await appendAudit({
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'setting.change',
        targetType: 'setting',
        targetId: `${input.name}@${version}`,
        reason: input.reason ?? null,
        details: { name: input.name, version, before: prev ? parseJson(prev.value) : null, after: value },
      }, t);
      return { name: input.name, version, value, createdBy: { id: actor.id, name: actor.name }, createdAt: createdAt.toISOString() };
    });
  } catch (e) {
    if ((e as { name?: string }).name === 'SequelizeUniqueConstraintError') {
      throw new HttpError(409, 'conflict', 'Someone else changed this setting at the same moment; reload and try again');
    }
    throw e;
  }
  if (input.name === 'search-defaults') clearSearchDefaultsCache();
  return result;
}
