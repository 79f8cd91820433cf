import type { RevisionContent } from "./revision-content";
import { findMethod } from "../../../shared/methods";
import { mropeAxisSummary } from "../../../shared/mrope-axes";

const esc = (v: unknown) =>
  String(v ?? "").replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!,
  );

/** "0–4, 6–10": runs of consecutive indices (layers or pairs). */
export function runs(idx: readonly number[]): string {
  const out: string[] = [];
  for (let i = 0; i < idx.length;) {
    let j = i;
    while (j + 1 < idx.length && idx[j + 1] === idx[j] + 1) j++;
    out.push(j === i ? String(idx[i]) : `${idx[i]}–${idx[j]}`);
    i = j + 1;
  }
  return out.join(", ") || "none";
}

/**
 * A layered revision's per-group results in the signed report (issue 11): each group's method and its own per-pair
 * flags, computed on that group's base, rotary dimension and method (the frozen, hashed content).
 */
export function groupsSection(c: RevisionContent): string {
  const groups = c.results.groups;
  if (!groups?.length) return "";
  const rows = groups
    .map((g) => {
      const how =
        g.method === "none"
          ? "no position encoding: never scaled"
          : `${findMethod(g.method)?.short ?? g.method}${g.scaled ? " (the plan's method)" : g.method === "default" ? " (as trained)" : " (its own method)"}`;
      const cells = [
        `${g.kind} (${g.layers.length} layers: ${runs(g.layers)})`,
        g.ropeTheta ?? "—",
        g.rotaryDim || "—",
        g.slidingWindow ?? "—",
        how,
        g.checkedUpTo,
        runs(g.flags.unseenAngles),
        runs(g.flags.compressedResolution),
        runs(g.flags.exceedsTrainedWindow),
      ];
      return `<tr data-kind="${esc(g.kind)}">${cells.map((v) => `<td>${esc(v)}</td>`).join("")}</tr>`;
    })
    .join("");
  const head = [
    "layers",
    "base",
    "d",
    "window",
    "rotates with",
    "checked up to",
    "pairs with unseen angles",
    "pairs with compressed resolution",
    "pairs that never complete a period in the trained window",
  ]
    .map((h) => `<th>${esc(h)}</th>`)
    .join("");
  return `<h2>Layer groups</h2><p>Each group is flagged with its own base, rotary dimension and method; a local-window group kept as trained is checked up to its window.</p><table><tr>${head}</tr>${rows}</table>`;
}

/**
 * A model with multimodal sections: which position axis each section's pairs rotate by (shared/mrope-axes.ts cites
 * the loaders), and how many of those pairs the plan's method flags, so a plan that scales them says what it scales.
 */
export function mropeSection(c: RevisionContent): string {
  const section = c.model.mropeSection;
  if (!section?.length) return "";
  const f = c.results.final;
  const pairs = f.bands.length;
  const interleaved = c.model.mropeInterleaved === true;
  const items = mropeAxisSummary(section, interleaved, pairs)
    .map(({ axis, pairs: idx }) => {
      const unseen = idx.filter((j) => f.flags.unseenAngles.includes(j)).length;
      const compressed = idx.filter((j) => f.flags.compressedResolution.includes(j)).length;
      return `<li data-axis="${axis}"><strong>${axis}</strong>: ${idx.length} pairs (${esc(runs(idx))}); the plan's ${esc(findMethod(f.method)?.short ?? f.method)} gives ${unseen} of them unseen angles and ${compressed} compressed resolution</li>`;
    })
    .join("");
  return `<h2>Multimodal sections</h2><p>mrope_section [${esc(section.join(", "))}], ${interleaved ? "interleaved (T H W T H W …)" : "in contiguous blocks (temporal, height, width)"}: the method rescales every pair, so each axis below is scaled with it.</p><ul>${items}</ul>`;
}
