// zod schemas of the report routes' bodies and queries (API.md, reports).
import { z } from 'zod';
import { peaksSchema } from '../query/schemas';
import { CONCLUSIONS, REPORT_STATUSES } from './types';

const score = z.number().finite().min(-1).max(1.0000001);
const text = (max: number) => z.string().trim().max(max, `at most ${max} characters`);

export const hitSchema = z
  .object({
    rank: z.number().int().min(1),
    spectrumId: z.number().int().positive(),
    version: z.number().int().positive(),
    name: z.string().max(255),
    formula: z.string().max(120).nullable().optional().default(null),
    nominalMass: z.number().finite().nullable().optional().default(null),
    ihd: z.number().finite().nullable().optional().default(null),
    scores: z.object({ cosine: score, reverseCosine: score, composite: score, entropy: score }).passthrough(),
    score,
    riDelta: z.number().finite().optional(),
  })
  .passthrough();

export const sampleSchema = z
  .object({
    sampleId: text(120).optional(),
    retentionTime: z.number().finite().min(0).max(100000).optional(),
    retentionIndex: z.number().finite().min(0).max(10000).optional(),
    riPhase: text(40).optional(),
    instrument: text(255).optional(),
    method: text(255).optional(),
    notes: text(4000).optional(),
  })
  .strict();

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD').refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'not a real date');

export const referenceStandardSchema = z
  .object({
    name: text(255).optional(),
    lot: text(120).min(1, 'the lot of the reference standard is required'),
    analysisDate: isoDate,
    retentionIndex: z.number().finite().min(0).max(10000).optional(),
    notes: text(2000).optional(),
  })
  .strict();

const selectedSchema = z.object({ recordId: z.number().int().positive(), version: z.number().int().positive() }).strict();

export const createReportSchema = z
  .object({
    title: text(255).min(1, 'a title is required'),
    query: z.object({ peaks: peaksSchema, sourceFileName: text(255).nullable().optional() }).strict(),
    search: z
      .object({
        filters: z.record(z.string(), z.unknown()).optional().default({}),
        options: z.record(z.string(), z.unknown()).optional().default({}),
        limit: z.number().int().min(1).max(500).nullable().optional(),
      })
      .passthrough()
      .optional()
      .default({ filters: {}, options: {} }),
    hits: z.array(hitSchema).max(500, 'at most 500 hits'),
    selected: selectedSchema.nullable().optional(),
    interpretation: z.unknown().optional(),
    sample: sampleSchema.optional(),
    riLadder: z.unknown().optional(),
    conclusion: z.enum(CONCLUSIONS).nullable().optional(),
    reasoning: text(20000).nullable().optional(),
    referenceStandard: referenceStandardSchema.nullable().optional(),
    supersedesReportId: z.number().int().positive().nullable().optional(),
  })
  .strict();

export const patchReportSchema = z
  .object({
    title: text(255).min(1).optional(),
    selected: selectedSchema.nullable().optional(),
    sample: sampleSchema.optional(),
    conclusion: z.enum(CONCLUSIONS).nullable().optional(),
    reasoning: text(20000).nullable().optional(),
    referenceStandard: referenceStandardSchema.nullable().optional(),
    interpretation: z.unknown().optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'nothing to change', path: ['(body)'] });

export const reviewSchema = z
  .object({
    action: z.enum(['submit', 'approve', 'return', 'comment']),
    comment: text(8000).optional(),
    password: z.string().max(1024).optional(),
  })
  .strict()
  .refine((v) => v.action !== 'return' || (v.comment && v.comment.length > 0), { message: 'a comment is required when returning a report', path: ['comment'] })
  .refine((v) => v.action !== 'comment' || (v.comment && v.comment.length > 0), { message: 'the comment is empty', path: ['comment'] })
  .refine((v) => v.action !== 'approve' || (v.password && v.password.length > 0), { message: 'approval is an electronic signature: re-enter your password', path: ['password'] });

export const listReportsSchema = z
  .object({
    status: z.union([z.enum(REPORT_STATUSES), z.literal('')]).optional(),
    conclusion: z.union([z.enum(CONCLUSIONS), z.literal('')]).optional(),
    author: z.string().max(255).optional(),
    reviewer: z.string().max(255).optional(),
    mine: z.enum(['1', 'true', '0', 'false', '']).optional(),
    q: z.string().max(200).optional(),
    from: z.union([isoDate, z.literal('')]).optional(),
    to: z.union([isoDate, z.literal('')]).optional(),
    format: z.enum(['json', 'csv']).optional(),
    page: z.coerce.number().int().min(1).optional(),
    pageSize: z.coerce.number().int().min(1).max(1000).optional(),
  })
  .strict();
