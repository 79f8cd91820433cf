import type { Band, Bands, PairResult } from "../../shared/schemas/analysis";
import { wavelength } from "./frequencies";

// Relative slack on the flag comparisons, so rounding in θ'/s products never flips a flag (DOMAIN: 1e−9).
const SLACK = 1e-9;

export interface PairWindow {
  trainedContext: number;
  targetContext: number;
  bands: Bands;
}

/** Band by rotations inside the trained window r = L/λ (see BAND_IDS in the shared schema for the names). */
export function bandOf(rotations: number, bands: Bands): Band {
  if (rotations >= bands.beta) return "spinning";
  if (rotations >= bands.alpha) return "turning";
  return "drifting";
}

/** Per-pair table with the flags exactly as docs/rotary-scaling.md defines them, judged on the original frequencies. */
export function classifyPairs(invFreq: ArrayLike<number>, scaled: ArrayLike<number>, w: PairWindow): PairResult[] {
  const L = w.trainedContext;
  const out: PairResult[] = [];
  for (let i = 0; i < invFreq.length; i++) {
    const theta = invFreq[i],
      thetaScaled = scaled[i];
    const lambda = wavelength(theta);
    const rotations = L / lambda;
    const exceedsTrainedWindow = lambda > L;
    const maxAngleTrained = L * theta;
    const maxAngleTarget = w.targetContext * thetaScaled;
    out.push({
      index: i,
      invFreq: theta,
      scaledInvFreq: thetaScaled,
      wavelength: lambda,
      scaledWavelength: wavelength(thetaScaled),
      rotationsInTrainedWindow: rotations,
      band: bandOf(rotations, w.bands),
      exceedsTrainedWindow,
      unseenAngles: exceedsTrainedWindow && maxAngleTarget > maxAngleTrained * (1 + SLACK),
      compressedResolution: rotations >= w.bands.beta && thetaScaled < theta * (1 - SLACK),
    });
  }
  return out;
}

export function summarisePairs(pairs: PairResult[]) {
  let unseenAnglesPairs = 0,
    compressedResolutionPairs = 0,
    exceedsTrainedWindowPairs = 0;
  for (const p of pairs) {
    if (p.unseenAngles) unseenAnglesPairs++;
    if (p.compressedResolution) compressedResolutionPairs++;
    if (p.exceedsTrainedWindow) exceedsTrainedWindowPairs++;
  }
  return { unseenAnglesPairs, compressedResolutionPairs, exceedsTrainedWindowPairs };
}
