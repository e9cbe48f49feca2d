import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

import { decodeText } from '@/lib/spectra/index';

const dir = fileURLToPath(new URL('../../fixtures/jcamp/', import.meta.url));

export function fixtureBytes(name: string): Buffer {
  return readFileSync(dir + name);
}

export function fixture(name: string): string {
  return decodeText(fixtureBytes(name));
}

/** The 10 bar peaks every xydata-*.jdx fixture holds (raw Y times YFACTOR 0.5). */
export const BENZENE_REGION_BARS: [number, number][] = [
  [37, 20], [38, 27.5], [39, 60], [40, 5], [45, 2.5],
  [48, 4], [49, 15], [50, 80], [51, 92.5], [52, 97.5],
];
