import { estimateHalogens, type HalogenEstimate } from './estimateHalogens';
import type { UnitSpectrum } from './toUnitSpectrum';

export interface ClusterStartOptions {
  /**
   * Peaks below this relative intensity (base peak = 100) are ignored.
   * @default 0.5
   */
  minRelative?: number;
  /**
   * Largest halogen fit (residual sum of squares) accepted for an isotope cluster.
   * @default 0.02
   */
  maxFit?: number;
  /**
   * Peaks at or above this m/z belong to another cluster.
   * @default Infinity
   */
  upperLimit?: number;
  /**
   * Largest number of Cl + Br atoms considered.
   * @default 6
   */
  maxHalogens?: number;
}

export interface ClusterStartEvaluation {
  /** true when every peak above `mz` (within the cluster's reach) can be its isotope peak */
  acceptable: boolean;
  mz: number;
  /** members: nominal m/z with relative intensity (base peak = 100) */
  members: Array<{ mz: number; relative: number }>;
  /** Cl/Br estimate for the cluster; null when there is no significant peak at `mz` */
  halogens: HalogenEstimate | null;
  /** observed (M+1)/M */
  m1Ratio: number;
  /** largest (M+1)/M that C, H, N, O, S and Si could give at this mass */
  m1RatioMax: number;
  reasons: string[];
}

/**
 * Largest plausible (M+1)/M at nominal mass m: every 12 u a carbon (1.08 % 13C
 * each, IUPAC CIAAW), plus room for N, H, Si and S contributions and noise.
 */
function maxM1Ratio(m: number): number {
  return 0.0112 * (m / 12) + 0.03;
}

/**
 * Tests whether nominal m/z `mz` can be the lightest member (M) of an isotope
 * cluster that holds every significant peak above it, up to M + 2·maxHalogens + 1:
 * the M+1 peak must not exceed what carbon and the other light elements give, each
 * odd member must be explainable as the 13C peak of the even one below, and the
 * even members must fit some Cl_nBr_m pattern.
 * @param unit - the spectrum merged to unit mass
 * @param mz - nominal m/z of the would-be M
 * @param options - see {@link ClusterStartOptions}
 */
export function evaluateClusterStart(
  unit: UnitSpectrum,
  mz: number,
  options: ClusterStartOptions = {},
): ClusterStartEvaluation {
  const { minRelative = 0.5, maxFit = 0.02, upperLimit = Infinity, maxHalogens = 6 } = options;
  const reach = 2 * maxHalogens + 1;
  const read = (x: number) => {
    const v = x < upperLimit ? (unit.intensities.get(x) ?? 0) : 0;
    return v >= minRelative ? v : 0;
  };
  const reasons: string[] = [];
  const base = read(mz);
  const members: Array<{ mz: number; relative: number }> = [];
  for (let x = mz; x <= mz + reach; x++) if (read(x) > 0) members.push({ mz: x, relative: read(x) });
  const m1RatioMax = maxM1Ratio(mz);
  if (base <= 0) {
    reasons.push(`no significant peak at m/z ${mz}`);
    return { acceptable: false, mz, members, halogens: null, m1Ratio: Infinity, m1RatioMax, reasons };
  }
  const halogens = estimateHalogens(unit, mz, { maxHalogens, upperLimit });
  const m1Ratio = read(mz + 1) / base;
  let acceptable = true;
  if (acceptable && m1Ratio > m1RatioMax) {
    acceptable = false;
    reasons.push(
      `m/z ${mz + 1} is ${(m1Ratio * 100).toFixed(0)} % of m/z ${mz}, more than an M+1 isotope peak can be (${(m1RatioMax * 100).toFixed(0)} %)`,
    );
  }
  if (acceptable) {
    const clusterMax = Math.max(...members.map((x) => x.relative));
    for (let k = 1; 2 * k + 1 <= reach; k++) {
      const odd = read(mz + 2 * k + 1);
      const even = read(mz + 2 * k);
      if (odd > m1RatioMax * Math.max(even, read(mz + 2 * k + 2)) + 0.05 * clusterMax) {
        acceptable = false;
        reasons.push(`m/z ${mz + 2 * k + 1} is too intense to be an isotope peak of m/z ${mz + 2 * k}`);
        break;
      }
    }
  }
  if (acceptable && halogens.fit > maxFit) {
    acceptable = false;
    reasons.push(`the cluster from m/z ${mz} fits no Cl/Br pattern (best fit ${halogens.fit.toFixed(3)})`);
  }
  return { acceptable, mz, members, halogens, m1Ratio, m1RatioMax, reasons };
}
