import type { PairResult } from "@shared/schemas/analysis";
import { sig, tokens } from "../figures";
import { BAND_STYLE, FLAG_IDS, FLAG_STYLE } from "./palette";

/** Exact values of one pair under the pointer. */
export function PairTooltipBody({ pair, methodLabel }: { pair: PairResult; methodLabel: string }) {
  const flags = FLAG_IDS.filter((f) => pair[f]);
  return (
    <div className="flex flex-col gap-0.5">
      <p className="font-semibold">
        Pair {pair.index} · {BAND_STYLE[pair.band].label}
      </p>
      <p>
        λ = {sig(pair.wavelength, 6)} tokens → λ′ = {sig(pair.scaledWavelength, 6)} ({methodLabel})
      </p>
      <p>r = L/λ = {sig(pair.rotationsInTrainedWindow, 5)} turns in the trained window</p>
      <p>
        θ = {pair.invFreq.toPrecision(6)} → θ′ = {pair.scaledInvFreq.toPrecision(6)} rad/token (θ′/θ ={" "}
        {sig(pair.scaledInvFreq / pair.invFreq, 5)})
      </p>
      {flags.length > 0 ? (
        <ul className="mt-1 list-disc pl-4">
          {flags.map((f) => (
            <li key={f} style={{ color: FLAG_STYLE[f].colour }}>
              {FLAG_STYLE[f].label}
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-1 text-ink-soft">No flags.</p>
      )}
      <p className="text-ink-soft">Period in tokens: {tokens(pair.scaledWavelength)} after scaling.</p>
    </div>
  );
}
