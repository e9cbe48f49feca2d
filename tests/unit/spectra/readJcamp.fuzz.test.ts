import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

import { describe, expect, it } from 'vitest';

import { decodeText, readJcamp } from '@/lib/spectra/index';

import { fixtureBytes } from './helpers';

// Seeded fuzzing: every mutation of a valid file must be either read (with
// sane peaks) or rejected with a message; readJcamp must never throw.

/** mulberry32, a small seeded PRNG (common practice, no source). */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const ASDF = '0123456789@ABCDEFGHIabcdefghi%JKLMNOPQRjklmnopqrSTUVWXYZs?+-., ;$#=\n';

function mutate(bytes: Uint8Array, random: () => number): Uint8Array {
  const pick = (n: number) => Math.floor(random() * n);
  const out = Array.from(bytes);
  const rounds = 1 + pick(3);
  for (let r = 0; r < rounds; r++) {
    const at = pick(out.length + 1);
    switch (pick(10)) {
      case 0: // delete a byte
        out.splice(at, 1);
        break;
      case 1: // insert a random byte
        out.splice(at, 0, pick(256));
        break;
      case 2: // replace with a character of the grammar
        out[at] = ASDF.charCodeAt(pick(ASDF.length));
        break;
      case 3: // truncate
        out.length = at;
        break;
      case 4: {
        // duplicate a line
        const text = String.fromCharCode(...out);
        const lines = text.split('\n');
        const l = pick(lines.length);
        lines.splice(l, 0, lines[l]);
        return Uint8Array.from([...lines.join('\n')].map((c) => c.charCodeAt(0) & 0xff));
      }
      case 5: {
        // delete a line
        const lines = String.fromCharCode(...out).split('\n');
        lines.splice(pick(lines.length), 1);
        return Uint8Array.from([...lines.join('\n')].map((c) => c.charCodeAt(0) & 0xff));
      }
      case 6: // change a digit
        for (let i = at; i < out.length; i++) {
          if (out[i] >= 48 && out[i] <= 57) {
            out[i] = 48 + pick(10);
            break;
          }
        }
        break;
      case 7: // flip a bit
        if (out.length > 0) out[at % out.length] ^= 1 << pick(8);
        break;
      case 8: // insert a long number
        out.splice(at, 0, ...Array.from({ length: 1 + pick(400) }, () => 48 + pick(10)));
        break;
      default: // swap two bytes
        if (out.length > 1) {
          const b = pick(out.length);
          [out[at % out.length], out[b]] = [out[b], out[at % out.length]];
        }
    }
  }
  return Uint8Array.from(out);
}

const fixtures = readdirSync(fileURLToPath(new URL('../../fixtures/jcamp/', import.meta.url)))
  .filter((name) => name.endsWith('.jdx'))
  .sort();

describe('readJcamp fuzz', () => {
  it('accepts or rejects 2,000 seeded mutations of valid files, never throwing', () => {
    const random = prng(20240611);
    let accepted = 0;
    let rejected = 0;
    for (let i = 0; i < 2000; i++) {
      const name = fixtures[i % fixtures.length];
      const mutated = mutate(fixtureBytes(name), random);
      let result;
      try {
        result = readJcamp(decodeText(mutated), { fileName: name });
      } catch (error) {
        throw new Error(`mutation ${i} of ${name} threw: ${String(error)}`);
      }
      if (result.ok) {
        accepted++;
        expect(result.spectra.length).toBeGreaterThan(0);
        for (const spectrum of result.spectra) {
          expect(spectrum.peaks.length).toBeGreaterThan(0);
          expect(spectrum.peaks.length).toBeLessThanOrEqual(100_000);
          let last = -Infinity;
          for (const [mz, intensity] of spectrum.peaks) {
            expect(Number.isFinite(mz) && mz > 0 && mz > last).toBe(true);
            expect(Number.isFinite(intensity) && intensity > 0).toBe(true);
            last = mz;
          }
        }
      } else {
        rejected++;
        expect(typeof result.error).toBe('string');
        expect(result.error.length).toBeGreaterThan(10);
        expect(result.error).not.toMatch(/could not be read: /); // an unforeseen failure inside the reader
      }
    }
    // both outcomes occur: the mutations are neither all harmless nor all fatal
    expect(accepted).toBeGreaterThan(100);
    expect(rejected).toBeGreaterThan(100);
  });
});
