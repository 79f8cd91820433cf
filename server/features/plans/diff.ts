import type { StageResult } from "../../../shared/schemas";
import type { RevisionContent } from "./revision-content";

export interface FieldChange {
  path: string;
  from: unknown;
  to: unknown;
}
export interface FlagChange {
  scope: string;
  pair: number;
  flag: string;
  from: boolean;
  to: boolean;
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

function changesOf(path: string, a: unknown, b: unknown, out: FieldChange[]) {
  if (same(a, b)) return;
  const objs = a && b && typeof a === "object" && typeof b === "object" && !Array.isArray(a) && !Array.isArray(b);
  if (objs) {
    const keys = new Set([...Object.keys(a as object), ...Object.keys(b as object)]);
    for (const k of keys)
      changesOf(path ? `${path}.${k}` : k, (a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], out);
  } else out.push({ path, from: a ?? null, to: b ?? null });
}

function flagChanges(scope: string, a: StageResult | undefined, b: StageResult | undefined, out: FlagChange[]) {
  if (!a || !b) return;
  for (const flag of ["unseenAngles", "compressedResolution", "exceedsTrainedWindow"] as const) {
    const A = new Set(a.flags[flag]);
    const B = new Set(b.flags[flag]);
    for (const p of new Set([...A, ...B]))
      if (A.has(p) !== B.has(p)) out.push({ scope, pair: p, flag, from: A.has(p), to: B.has(p) });
  }
}

/** What changed between two revisions: inputs field by field, stages by position, and pairs whose flags flipped. */
export function diffContents(a: RevisionContent, b: RevisionContent) {
  const fields: FieldChange[] = [];
  for (const key of ["targetContext", "method", "bands", "notes", "model", "acceptance"] as const)
    changesOf(key, a[key], b[key], fields);
  const stages: { index: number; change: "added" | "removed" | "changed"; fields: FieldChange[] }[] = [];
  for (let i = 0; i < Math.max(a.stages.length, b.stages.length); i++) {
    const sa = a.stages[i];
    const sb = b.stages[i];
    if (!sa) stages.push({ index: i, change: "added", fields: [] });
    else if (!sb) stages.push({ index: i, change: "removed", fields: [] });
    else {
      const f: FieldChange[] = [];
      changesOf("", sa, sb, f);
      if (f.length) stages.push({ index: i, change: "changed", fields: f });
    }
  }
  const flags: FlagChange[] = [];
  flagChanges("final", a.results.final, b.results.final, flags);
  a.results.stages.forEach((s, i) => flagChanges(`stages.${i}`, s, b.results.stages[i], flags));
  return { fields, stages, flags, budget: budgetDiff(a, b) };
}

type Costed = {
  estimate: {
    stages: { cost: number; acceleratorHours: number; tokens: number }[];
    totals: { cost: number; acceleratorHours: number };
  };
};
const costed = (c: RevisionContent) => (c.budget && "estimate" in c.budget ? (c.budget as Costed) : undefined);
/** The currency a revision's budget was frozen in; budget model 1 sheets predate the setting and carry none. */
const currencyOf = (c: RevisionContent) => {
  const currency = (c.budget as { currency?: unknown } | undefined)?.currency;
  return typeof currency === "string" ? currency : null;
};

/** Which stage costs more, and by how much (b minus a). */
function budgetDiff(a: RevisionContent, b: RevisionContent) {
  const inputs: FieldChange[] = [];
  changesOf("budget.inputs", a.budget?.inputs, b.budget?.inputs, inputs);
  const ea = costed(a);
  const eb = costed(b);
  if (!ea || !eb) return { inputs, stages: [], totals: null };
  const n = Math.max(ea.estimate.stages.length, eb.estimate.stages.length);
  const stages = Array.from({ length: n }, (_, i) => {
    const x = ea.estimate.stages[i];
    const y = eb.estimate.stages[i];
    return {
      index: i,
      costFrom: x?.cost ?? null,
      costTo: y?.cost ?? null,
      costDelta: (y?.cost ?? 0) - (x?.cost ?? 0),
      hoursDelta: (y?.acceleratorHours ?? 0) - (x?.acceleratorHours ?? 0),
    };
  });
  return {
    inputs,
    stages,
    totals: {
      costFrom: ea.estimate.totals.cost,
      costTo: eb.estimate.totals.cost,
      costDelta: eb.estimate.totals.cost - ea.estimate.totals.cost,
      currencyFrom: currencyOf(a),
      currencyTo: currencyOf(b),
    },
  };
}
