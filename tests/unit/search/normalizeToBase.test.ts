import { describe, expect, it } from 'vitest';
import { normalizeToBase } from '../../../src/lib/search/normalizeToBase';

describe('normalizeToBase', () => {
  it('scales the base peak to 1', () => {
    expect(normalizeToBase([[41, 250], [43, 1000], [57, 500]])).toEqual([[41, 0.25], [43, 1], [57, 0.5]]);
  });
  it('keeps an empty list empty', () => {
    expect(normalizeToBase([])).toEqual([]);
  });
});
