// The audit trail is append-only: no code path of the app updates or deletes
// audit rows (the production account gets only INSERT and SELECT on them).
import { describe, it, expect } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';

function files(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? files(p) : /\.(ts|tsx|mjs|js|astro)$/.test(e.name) ? [p] : [];
  });
}

describe('audit trail has no update or delete path', () => {
  const sources = [...files('src'), ...files('scripts'), ...files('seeds')];
  it('finds the sources', () => expect(sources.length).toBeGreaterThan(20));
  for (const f of sources) {
    it(f, () => {
      const text = fs.readFileSync(f, 'utf8');
      expect(text).not.toMatch(/UPDATE\s+`?audit_event`?/i);
      expect(text).not.toMatch(/DELETE\s+FROM\s+`?audit_event`?/i);
      expect(text).not.toMatch(/TRUNCATE\s+(TABLE\s+)?`?audit_event`?/i);
      expect(text).not.toMatch(/AuditEvent\.(update|destroy|upsert|truncate|bulkCreate\([^)]*updateOnDuplicate)/);
    });
  }
});
