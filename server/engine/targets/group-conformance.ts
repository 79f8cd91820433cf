import type { GroupRotary } from "../group-rotary";
import { conformance, type Conformance } from "./conformance";
import type { ConformanceStatus, ConsumerReading, GroupConformance, PlanRotary } from "./types";

const RANK: Record<ConformanceStatus, number> = { exact: 0, equivalent: 1, differs: 2, unsupported: 3 };

const planOf = (plan: PlanRotary, g: GroupRotary): PlanRotary => ({
  ...plan,
  rotaryDim: g.rotaryDim,
  base: g.base,
  invFreq: g.invFreq,
  attentionFactor: g.attentionFactor,
});

const words = (g: GroupRotary) => `${g.kind} layers (base ${g.base}, ${g.method.method})`;

/**
 * Extends a target's conformance to every rotating layer group of a layered plan (issue 11). A reader that reports
 * per-layer-type readings (transformers v5 nests rope_parameters by layer type) is compared group by group and earns
 * the worst group's status. A reader that reports one reading gives every layer that one setting from this artifact:
 * the generic rope path of transformers 4.x, vLLM, SGLang and llama.cpp reads one rope_theta and one rope_scaling
 * (per-architecture model files may set layers apart, e.g. vllm-project/vllm vllm/model_executor/models/gemma3.py at
 * 004dc924 gives its sliding layers rope_local_base_freq unscaled, but only for that architecture). When some group's
 * own setting differs from it, the target cannot express the plan: `unsupported`, with the groups named.
 */
export function coverGroups(plan: PlanRotary, reading: ConsumerReading | null, c: Conformance): Conformance {
  const groups = plan.groups;
  if (!groups || groups.length < 2 || !reading) return c;
  const perGroup: GroupConformance[] = groups.map((g) => {
    const read = readingFor(reading, g);
    if (!read) {
      return {
        kind: g.kind,
        status: "differs",
        maxRelativeError: null,
        worstPair: null,
        cause: `no setting for ${g.kind}`,
      };
    }
    const one = conformance(planOf(plan, g), read);
    return {
      kind: g.kind,
      status: one.status,
      maxRelativeError: one.maxRelativeError,
      worstPair: one.worstPair,
      cause: one.cause,
    };
  });
  if (c.status === "unsupported") return { ...c, groups: perGroup };
  // The scaled group's own difference is already in `c`; here it is the other groups the one setting gets wrong.
  const off = groups.filter((g, i) => !g.scaled && perGroup[i].status === "differs");
  if (!reading.layerGroups && off.length) {
    const named = off.map(words);
    return {
      ...c,
      status: "unsupported",
      maxRelativeError: null,
      worstPair: null,
      cause:
        `it reads one rotary setting for every layer from this artifact, so it cannot carry the ${named.join(" and ")} ` +
        `beside the others${c.cause ? `. ${c.cause}` : "."}`,
      workaround:
        "export for transformers-v5 (rope_parameters nested by layer type). The probe reads only the config, so only a " +
        "run of this stack can show whether its model code keeps those layers apart",
      groups: perGroup,
    };
  }
  const worst = perGroup.reduce((w, g) => (RANK[g.status] > RANK[w.status] ? g : w), perGroup[0]);
  if (RANK[worst.status] <= RANK[c.status]) return { ...c, groups: perGroup };
  return {
    ...c,
    status: worst.status,
    maxRelativeError: worst.maxRelativeError,
    worstPair: worst.worstPair,
    cause: `the ${worst.kind} layers: ${worst.cause}`.trim(),
    groups: perGroup,
  };
}

/** What the consumer rotates the group's layers with: its own layer type's reading, or the one flat reading. */
function readingFor(r: ConsumerReading, g: GroupRotary): ConsumerReading | null {
  if (!r.layerGroups) return r;
  const own = r.layerGroups.find((x) => x.layerType === g.kind);
  if (!own) return null;
  return { ...r, ...own, rotaryDim: own.invFreq.length * 2, warnings: [], originalLength: null };
}
