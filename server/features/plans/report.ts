import type { RevisionContent } from "./revision-content";
import type { AdoptedBaseSupport } from "../../../shared/schemas/plans";
import { findMethod } from "../../../shared/methods";
import { groupsSection, mropeSection } from "./report-groups";
import { DECISION_WORDS, STATE_WORDS } from "../../../shared/review-words";
import type { RevisionState } from "../../../shared/schemas/plans";

const esc = (v: unknown) =>
  String(v ?? "").replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!,
  );
const n = (v: number) => (Number.isInteger(v) ? v.toLocaleString("en-US") : v.toPrecision(6));

/** Scaled wavelength per pair on a log axis, trained and target lengths as lines; plain inline SVG so it prints. */
function wavelengthChart(c: RevisionContent) {
  const w = 640,
    h = 220,
    pad = 36;
  const waves = c.results.final.scaledWavelengths;
  const lo = Math.log10(Math.max(1, Math.min(...waves)));
  const hi = Math.log10(Math.max(c.targetContext, ...waves)) + 0.2;
  const y = (v: number) => h - pad - ((Math.log10(v) - lo) / (hi - lo)) * (h - 2 * pad);
  const x = (i: number) => pad + (i / Math.max(1, waves.length - 1)) * (w - 2 * pad);
  const colour: Record<string, string> = { spinning: "#2d7a74", turning: "#9a5b1f", drifting: "#5b4a8a" };
  const dots = waves
    .map(
      (v, i) =>
        `<circle cx="${x(i).toFixed(1)}" cy="${y(v).toFixed(1)}" r="2.5" fill="${colour[c.results.final.bands[i]] ?? "#333"}"/>`,
    )
    .join("");
  const line = (v: number, label: string, dash: string) =>
    `<line x1="${pad}" x2="${w - pad}" y1="${y(v)}" y2="${y(v)}" stroke="#b23a2e" stroke-dasharray="${dash}"/><text x="${w - pad}" y="${y(v) - 4}" text-anchor="end" font-size="10">${esc(label)} ${n(v)}</text>`;
  return `<svg width="${w}" height="${h}" role="img" aria-label="scaled wavelength per pair">
    <rect x="0" y="0" width="${w}" height="${h}" fill="#fffdf8"/>${dots}
    ${line(c.model.trainedContext, "trained", "4 3")}${line(c.targetContext, "target", "1 2")}
    <text x="${pad}" y="${h - 8}" font-size="10">pair 0 → ${waves.length - 1}; wavelength in tokens, log scale</text></svg>`;
}

export interface ReportInput {
  plan: { id: number; title: string; purpose: string; owner?: { name: string } };
  revision: { number: number; state: string; contentHash: string; engineVersion: string };
  content: RevisionContent;
  verified: boolean;
  /** What failed when not verified (hash, signed hashes, signatures). */
  problems?: string[];
  decisions: { approver: { name: string }; decision: string; comment: string; signedHash: string; at: string }[];
  budgetHtml?: string;
  /** After approval: the proof state and every proof decision, newest first, each signature checked. */
  proof?: {
    state: "proven" | "unproven" | null;
    decisions: {
      verdict: string;
      reason: string;
      contentHash: string;
      evidenceIds: number[];
      by: { name: string };
      at: string;
      keyId: string;
      signatureStatus: string;
    }[];
  };
  /** Each base the plan adopts with its complete supported length (base-support.ts). */
  adoptedBases?: readonly AdoptedBaseSupport[];
}

const PROOF_WORDS: Record<string, string> = { proven: "Proven", unproven: "Not proven" };
const SIGNATURE_WORDS: Record<string, string> = {
  valid: "signature holds",
  invalid: "SIGNATURE DOES NOT HOLD",
  missing: "no signature",
  unknown_key: "signed with a key this server does not know",
};

/** The proof section: only for a revision that has been approved (proof follows approval). */
function proofSection(revisionState: string, proof: ReportInput["proof"]) {
  if (!proof || !["approved", "superseded"].includes(revisionState)) return "";
  const state = proof.state
    ? `<p data-proof="${esc(proof.state)}"><strong>${esc(PROOF_WORDS[proof.state])}</strong>: the latest proof decision below.</p>`
    : "<p>Awaiting proof: no approver has decided yet whether the evaluations meet the acceptance criteria.</p>";
  const rows = proof.decisions
    .map(
      (d) =>
        `<tr><td>${esc(d.by.name)}</td><td>${esc(PROOF_WORDS[d.verdict] ?? d.verdict)}</td><td>${esc(d.reason)}</td><td><code>${esc(d.contentHash)}</code></td><td>${esc(d.evidenceIds.map((id) => `#${id}`).join(", ") || "none")}</td><td class="${d.signatureStatus === "valid" ? "ok" : "bad"}">${esc(SIGNATURE_WORDS[d.signatureStatus] ?? d.signatureStatus)} (key ${esc(d.keyId.slice(0, 12))}…)</td><td>${esc(d.at)}</td></tr>`,
    )
    .join("");
  const head = ["approver", "verdict", "reason", "signed hash", "evidence read", "signature", "at"]
    .map((h) => `<th>${h}</th>`)
    .join("");
  return `<h2>Proof</h2>${state}${rows ? `<table><tr>${head}</tr>${rows}</table>` : ""}`;
}

export function renderReport({
  plan,
  revision,
  content: c,
  verified,
  problems = [],
  decisions,
  budgetHtml,
  proof,
  adoptedBases = [],
}: ReportInput) {
  const row = (cells: unknown[]) => `<tr>${cells.map((v) => `<td>${esc(v)}</td>`).join("")}</tr>`;
  const head = (cells: string[]) => `<tr>${cells.map((v) => `<th>${esc(v)}</th>`).join("")}</tr>`;
  const params = (p: object) =>
    Object.entries(p)
      .filter(([k]) => k !== "method")
      .map(([k, v]) => `${k}=${Array.isArray(v) ? `[${v.length} values]` : typeof v === "number" ? n(v) : v}`)
      .join(", ");
  const stageRows = c.stages
    .map((s, i) => {
      const r = c.results.stages[i];
      return row([
        i + 1,
        n(s.targetContext),
        `${findMethod(s.method.method)?.short ?? s.method.method} ${params(s.method)}`,
        n(s.steps),
        n(s.globalBatch),
        n(s.sequenceLength),
        s.learningRate,
        s.dataMix,
        `${r?.summary.unseenAnglesPairs ?? "–"} / ${r?.summary.compressedResolutionPairs ?? "–"} / ${r?.summary.exceedsTrainedWindowPairs ?? "–"}`,
      ]);
    })
    .join("");
  const f = c.results.final;
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(plan.title)} — revision ${revision.number}</title>
<style>
body{font-family:"IBM Plex Sans",system-ui,sans-serif;color:#1f2633;background:#fff;margin:2rem auto;max-width:56rem;font-size:14px;line-height:1.45}
h1{font-size:24px;margin:0}h2{font-size:17px;border-bottom:1px solid #d9cfbd;margin-top:1.6rem}table{border-collapse:collapse;width:100%}
td,th{border:1px solid #d9cfbd;padding:3px 6px;text-align:left;vertical-align:top}th{background:#f6f1e7}code{font-size:12px;word-break:break-all}
.bad{color:#b23a2e;font-weight:600}.ok{color:#2d7a74;font-weight:600}.caution{background:#f6f1e7;padding:.6rem;border-left:4px solid #9a5b1f}
@media print{body{margin:0}}</style></head><body>
<h1>${esc(plan.title)}</h1>
<p>Plan #${plan.id}, revision ${revision.number} (${esc(STATE_WORDS[revision.state as RevisionState] ?? revision.state)}) · owner ${esc(plan.owner?.name)} · engine ${esc(revision.engineVersion)}</p>
<p>Content hash (SHA-256 of RFC 8785 canonical JSON): <code>${esc(revision.contentHash)}</code> —
${verified ? '<span class="ok">verified: the stored content matches its hash and every decision\'s server signature holds</span>' : `<span class="bad">INTEGRITY CHECK FAILED: ${esc(problems.join("; ") || "the stored content does not match its hash")}</span>`}</p>
<p>${esc(plan.purpose)}</p>
<h2>Inputs</h2><table>${head(["model", "d", "base", "trained", "target", "method"])}
${row([`${c.model.name} (${c.model.family})`, c.results.rotaryDim, n(c.model.ropeTheta), n(c.model.trainedContext), n(c.targetContext), `${findMethod(c.method.method)?.label ?? c.method.method} ${params(c.method)}`])}</table>
<h2>Result at the target</h2>
<p>Attention factor ${n(f.attentionFactor)}; pairs reaching unseen angles ${f.summary.unseenAnglesPairs}, with compressed resolution ${f.summary.compressedResolutionPairs},
longer than the trained window ${f.summary.exceedsTrainedWindowPairs}. Critical dimension ${c.results.criticalDimension} (Liu et al. 2023).</p>
${adoptedBases.map((b) => `<p>New base ${n(b.base)}: ${b.reachesTarget ? `<span class="ok">reaches ${n(b.target)} tokens</span>, no position below it fails the bound (complete scan)` : `<span class="bad">falls short</span>, fails the bound at ${n(b.supportedLength ?? 0)} tokens, below ${n(b.target)}`} (Men et al. 2024).</p>`).join("\n")}
${wavelengthChart(c)}
${groupsSection(c)}${mropeSection(c)}
<p>Configuration patch:</p><pre><code>${esc(JSON.stringify(f.patch, null, 2))}</code></pre>
<h2>Stages</h2>${c.stages.length ? `<table>${head(["#", "target", "method", "steps", "batch", "seq len", "lr", "data mix", "unseen / compressed / beyond window"])}${stageRows}</table>` : "<p>No stages.</p>"}
${budgetHtml ?? ""}
<h2>Acceptance criteria</h2>${c.acceptance.length ? `<table>${head(["evaluation", "context", "metric", "must be"])}${c.acceptance.map((a) => row([a.evaluation, n(a.contextLength), a.metric, `${a.comparison} ${a.threshold}`])).join("")}</table>` : "<p>None stated.</p>"}
<h2>Decisions</h2>${decisions.length ? `<table>${head(["inspector", "decision", "comment", "signed hash", "at"])}${decisions.map((d) => `<tr><td>${esc(d.approver.name)}</td><td>${esc(DECISION_WORDS[d.decision as keyof typeof DECISION_WORDS]?.done ?? d.decision)}</td><td>${esc(d.comment)}</td><td><code>${esc(d.signedHash)}</code></td><td>${esc(d.at)}</td></tr>`).join("")}</table>` : "<p>No decisions yet.</p>"}
${proofSection(revision.state, proof)}
<h2>Notes</h2><p>${esc(c.notes) || "—"}</p>
<p class="caution">Every figure here is an estimate under the stated conventions. A plan is confirmed only by long-context evaluations of the tuned model.</p>
</body></html>`;
}
