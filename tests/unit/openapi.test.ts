// The OpenAPI document lists every route of the manifest and is valid 3.1 in shape.
import { describe, it, expect } from 'vitest';
import { openApiDocument } from '../../src/lib/openapi';
import { API_ROUTES } from '../../src/lib/route-manifest';

describe('openApiDocument', () => {
  const doc = openApiDocument();
  it('is OpenAPI 3.1 with every manifest route', () => {
    expect(doc.openapi).toBe('3.1.0');
    for (const key of Object.keys(API_ROUTES)) {
      const [method, pattern] = key.split(' ');
      if (pattern.includes('[...')) continue;
      const p = pattern.replace(/\[(\w+)\]/g, '{$1}');
      expect(doc.paths[p]?.[method.toLowerCase()], key).toBeTruthy();
    }
  });
  it('describes the search body with its query forms', () => {
    const op = doc.paths['/api/search'].post as any;
    const schema = op.requestBody.content['application/json'].schema;
    expect(JSON.stringify(schema)).toContain('spectrumId');
    expect(JSON.stringify(schema)).toContain('rankBy');
  });
});
