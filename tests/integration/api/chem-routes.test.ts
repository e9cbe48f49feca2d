// /api/formula and /api/interpret: answers and bad input (400 with a message).
import { describe, it, expect, afterAll } from 'vitest';
import { useTestDatabase } from '../../helpers/db';
import { callRoute } from '../../helpers/route';
import { closeSequelize } from '../../../src/lib/db/sequelize';
import { GET as formula } from '../../../src/pages/api/formula';
import { POST as interpret } from '../../../src/pages/api/interpret';

useTestDatabase();
afterAll(() => closeSequelize());

describe('GET /api/formula', () => {
  it('answers C6H5Br with Hill formula, masses, IHD and the Br doublet', async () => {
    const r = await callRoute(formula, { url: 'http://127.0.0.1/api/formula?mf=C6H5Br' });
    expect(r.status).toBe(200);
    expect(r.json.formula).toBe('C6H5Br');
    expect(r.json.nominalMass).toBe(156);
    // NIST isotope masses: 6 x 12 + 5 x 1.00782503 + 78.9183376 = 155.9574
    expect(r.json.monoisotopicMass).toBeCloseTo(155.95746, 4);
    expect(r.json.ihd).toBe(4);
    const top = [...r.json.isotopePattern].sort((a: any, b: any) => b.relative - a.relative).slice(0, 2);
    // common practice, no source: 79Br/81Br about 1:1
    expect(Math.round(Math.min(...top.map((p: any) => p.relative)))).toBeGreaterThan(90);
  });
  for (const mf of ['Xx9', '', 'C6H6)']) {
    it(`answers ${JSON.stringify(mf)} with 400 and a message`, async () => {
      const r = await callRoute(formula, { url: `http://127.0.0.1/api/formula?mf=${encodeURIComponent(mf)}` });
      expect(r.status).toBe(400);
      expect(r.json.error.message).toMatch(/mf/);
    });
  }
});

describe('POST /api/interpret', () => {
  it('finds the molecular ion of a chlorobenzene-like spectrum and one Cl', async () => {
    // Synthetic peaks; Cl 35/37 about 3:1 (common practice, no source).
    const peaks = [[51, 12], [77, 40], [112, 100], [113, 6.6], [114, 32.5], [115, 2.1]];
    const r = await callRoute(interpret, { method: 'POST', body: { peaks } });
    expect(r.status).toBe(200);
    expect(r.json.molecularIon.mz).toBe(112);
    expect(r.json.halogenEstimate.Cl).toBe(1);
    expect(r.json.halogenEstimate.Br).toBe(0);
    expect(r.json.losses.some((l: any) => l.fromMz === 112 && l.toMz === 77)).toBe(true);
  });
  for (const [label, body] of [
    ['empty peaks', { peaks: [] }],
    ['negative m/z', { peaks: [[-5, 10]] }],
    ['no query', {}],
    ['non-finite', '{"peaks": [[50, 1e999]]}'],
  ] as const) {
    it(`answers ${label} with 400 and a message`, async () => {
      const r = await callRoute(interpret, { method: 'POST', body });
      expect(r.status).toBe(400);
      expect(typeof r.json.error.message).toBe('string');
    });
  }
});
