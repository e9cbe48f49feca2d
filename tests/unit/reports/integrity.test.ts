import crypto from 'node:crypto';
import { describe, it, expect } from 'vitest';
import { integrityOf, reportContent, reportHmac } from '../../../src/lib/reports/integrity';
import { headToTailSvg } from '../../../src/lib/reports/headToTailSvg';
import { reportLabel } from '../../../src/lib/reports/reportLabel';

const row = {
  id: 7, title: 'T', status: 'approved', authorId: 'a', reviewerId: 'b', conclusion: 'tentative', reasoning: 'r',
  sample: '{"sampleId":"S1","retentionIndex":800}', snapshot: { hits: [], query: { peaks: [[43, 100]] } }, selectedRecordId: 3, selectedVersion: 1,
  criteria: null, criteriaSettingsVersion: null, referenceStandard: null, supersedesReportId: null,
  submittedAt: new Date('2025-01-02T03:04:05.678Z'), decidedAt: '2025-01-03T00:00:00.000Z', createdAt: new Date('2025-01-01T00:00:00Z'),
  hmac: 'ignored', updatedAt: new Date(),
};
const cites = [{ recordId: 3, version: 1, role: 'selected' }];

describe('reportContent', () => {
  it('is canonical: key order, JSON-as-text and date forms do not matter; hmac and updatedAt are not covered', () => {
    const a = reportContent(row, cites);
    const b = reportContent({ ...row, sample: { retentionIndex: 800, sampleId: 'S1' }, submittedAt: '2025-01-02T03:04:05.678Z', hmac: 'x', updatedAt: new Date(0) }, cites);
    expect(a).toBe(b);
    expect(JSON.parse(a).sample).toEqual({ retentionIndex: 800, sampleId: 'S1' });
    expect(reportContent({ ...row, reasoning: 'r2' }, cites)).not.toBe(a);
    expect(reportContent(row, [{ recordId: 3, version: 2, role: 'selected' }])).not.toBe(a);
  });
});

describe('reportHmac', () => {
  // RFC 4231 test case 2 (HMAC-SHA-256, key "Jefe").
  it('is HMAC-SHA-256', () => {
    expect(reportHmac('what do ya want for nothing?', 'Jefe')).toBe('5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843');
  });
  it('is intact only with the right key and content, and only when approved', () => {
    const c = reportContent(row, cites);
    const mac = reportHmac(c, 'k1');
    expect(integrityOf('approved', mac, c, 'k1')).toBe('intact');
    expect(integrityOf('approved', mac, c, 'k2')).toBe('altered');
    expect(integrityOf('approved', mac, c + ' ', 'k1')).toBe('altered');
    expect(integrityOf('approved', crypto.createHash('sha256').update(c).digest('hex'), c, 'k1')).toBe('altered');
    expect(integrityOf('approved', null, c, 'k1')).toBe('altered');
    expect(integrityOf('draft', null, c, 'k1')).toBe('unsigned');
    expect(integrityOf('draft', mac, c, 'k1')).toBe('altered');
  });
});

describe('headToTailSvg', () => {
  it('draws query sticks up in teal and reference sticks down in copper', () => {
    const svg = headToTailSvg([[43, 100], [58, 50]], [[43, 80], [71, 100]], { queryLabel: 'Q <1>' });
    expect(svg.startsWith('<svg')).toBe(true);
    expect((svg.match(/stroke="#1f7a7a" stroke-width="1.6"/g) ?? []).length).toBe(2);
    expect((svg.match(/stroke="#b85c25" stroke-width="1.6"/g) ?? []).length).toBe(2);
    expect(svg).toContain('Q &lt;1&gt;');
  });
  it('says so when no reference is selected', () => {
    expect(headToTailSvg([[43, 100]], null)).toContain('No reference selected');
  });
});

describe('reportLabel', () => {
  it('pads the id', () => {
    expect(reportLabel(12)).toBe('IR-00012');
    expect(() => reportLabel(0)).toThrow(RangeError);
  });
});
