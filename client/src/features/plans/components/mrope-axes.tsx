import type { RevisionContent } from "@shared/schemas/plans";
import { mropeAxisSummary } from "@shared/mrope-axes";
import { layerRuns } from "@/components/layer-groups-table";
import { methodShort } from "../lib/method-table";

/**
 * A model with multimodal sections: which position axis each section's pairs rotate by, and how many of them the
 * plan's method flags. The method rescales every pair, so every axis is scaled with it.
 */
export function MropeAxes({ content }: { content: RevisionContent }) {
  const section = content.model.mropeSection;
  if (!section?.length) return null;
  const f = content.results.final;
  const interleaved = content.model.mropeInterleaved === true;
  const axes = mropeAxisSummary(section, interleaved, f.bands.length);
  return (
    <div data-testid="mrope-axes" className="flex flex-col gap-1 text-body">
      <h3 className="text-lead font-semibold text-ink">Multimodal sections</h3>
      <p className="text-note text-ink-soft">
        mrope_section [{section.join(", ")}],{" "}
        {interleaved ? "interleaved (T H W T H W …)" : "in contiguous blocks (temporal, height, width)"}. The
        plan&apos;s {methodShort(f.method)} rescales each of them:
      </p>
      <ul className="flex flex-col gap-0.5">
        {axes.map(({ axis, pairs }) => {
          const unseen = pairs.filter((j) => f.flags.unseenAngles.includes(j)).length;
          const compressed = pairs.filter((j) => f.flags.compressedResolution.includes(j)).length;
          return (
            <li key={axis} data-axis={axis}>
              <span className="font-medium">{axis}</span>: {pairs.length} pairs ({layerRuns(pairs)}); {unseen} with
              unseen angles, {compressed} with compressed resolution
            </li>
          );
        })}
      </ul>
    </div>
  );
}
