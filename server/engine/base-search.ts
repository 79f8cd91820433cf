import { inverseFrequencies } from "./frequencies";
import { gridBases, supportedLength, type BaseGrid } from "./base-bound";

export type LengthScan = (invFreq: ArrayLike<number>, maxLength: number) => number | null;

export interface SmallestBaseResult {
  /** smallest grid base whose supported length reaches the target, or null when none on the grid does */
  smallestBase: number | null;
  candidatesExamined: number;
  candidatesTotal: number;
}

/**
 * Smallest base on the grid that supports the target (Men et al. 2024). Valid bases are not monotone
 * (a base can fail where a smaller one passed), so this scans candidates upward rather than bisecting;
 * each failing candidate stops at its own first negative B(m).
 */
export function smallestSupportingBase(
  d: number,
  targetContext: number,
  grid: BaseGrid,
  opts: { scan?: LengthScan; onProgress?: (examined: number, total: number) => void } = {},
): SmallestBaseResult {
  const scan = opts.scan ?? supportedLength;
  const bases = gridBases(grid);
  for (let i = 0; i < bases.length; i++) {
    const first = scan(inverseFrequencies(d, bases[i]), targetContext);
    opts.onProgress?.(i + 1, bases.length);
    if (first === null) return { smallestBase: bases[i], candidatesExamined: i + 1, candidatesTotal: bases.length };
  }
  return { smallestBase: null, candidatesExamined: bases.length, candidatesTotal: bases.length };
}
