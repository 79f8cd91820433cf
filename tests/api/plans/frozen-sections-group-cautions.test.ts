import { describe, expect, it } from "vitest";
import { exportEnvelopeSchema, revisionResponseSchema } from "../../../shared/schemas/plans";
import { applyMergePatch } from "../../../server/engine/targets";
import { makeTestApp, type Agent } from "../../setup/app";
import {
  fixtureBytes,
  importSectionedModel,
  LAYERED_SECTIONS,
  rewriteStoredContent,
  submittedPlan,
} from "../../setup/frozen-sections";
import { decide } from "../../setup/plans";

/*
 * Layer-group blocks of a layered multimodal model signed before they carried the sections (issue 11). Every export of
 * a layered revision hands out each group's block (layerGroups[].config) and the v5 nesting built from them
 * (ropeParametersByLayerType), and the rotating layers read the sections on every step (huggingface/transformers
 * src/transformers/models/qwen2_vl/modeling_qwen2_vl.py at 00b676f8, `self.rope_scaling["mrope_section"]`), so the
 * export and the plan page name each group block that lacks them. Old revisions are faked the way
 * tests/api/plans/frozen-sections-stages.test.ts fakes one: the blocks as the older engine froze them, written in review
 * with their own valid hash. The expected cautions are checked against the blocks themselves: a group is named exactly
 * when its block leaves the model without mrope_section as some consumer applies it: merged onto the model's own file
 * (RFC 7396; a null rope_scaling deletes them) or taken as the whole rope_scaling block (vLLM and SGLang replace
 * top-level keys whole, server/engine/targets/registry.ts SECTIONS_WITH_ARTIFACT cites where).
 */
const { agentAs } = makeTestApp();
const sectionsAfter = (patch: object) =>
  (
    applyMergePatch(JSON.parse(fixtureBytes(LAYERED_SECTIONS).toString()), patch) as {
      rope_scaling?: { mrope_section?: unknown } | null;
    }
  ).rope_scaling?.mrope_section;
const CODE = "frozen_config_lacks_sections";

type Patch = { rope_scaling: Record<string, unknown> | null } & Record<string, unknown>;
type Group = { kind: string; patch: Patch } & Record<string, unknown>;
/** A block as engine 1.0 froze it: the scaling keys without the section keys (and without the repeated `type`). */
const withoutSections = (p: Patch): Patch => {
  if (p.rope_scaling === null || p.rope_scaling.rope_type === "default") return { ...p, rope_scaling: null };
  const { mrope_section: _, mrope_interleaved: __, type: ___, ...rest } = p.rope_scaling;
  return { ...p, rope_scaling: rest };
};

async function signedOld(
  researcher: Agent,
  approver: Agent,
  method: "ntk" | "linear",
  age: (stored: { results: { final: { patch: Patch }; groups: Group[] } }) => { engineVersion: string },
) {
  const modelId = await importSectionedModel(researcher, LAYERED_SECTIONS, "GrpSect");
  const revision = { targetContext: 131072, method: { method } };
  const { id, base } = await submittedPlan(researcher, modelId, revision, "Group cautions");
  const fresh = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
  expect(fresh.blockCautions).toEqual([]);

  const { hash } = await rewriteStoredContent(id, age);
  await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);
  const exp = exportEnvelopeSchema.parse((await researcher.get(`/api/plans/${id}/approved/export`).expect(200)).body);
  expect(exp.contentHash).toBe(hash);
  const page = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
  return { id, exp, page };
}

/** The group kinds whose exported block, merged onto the model's file or taken whole, leaves it without sections. */
const groupsLosingSections = (exp: { layerGroups?: { kind: string; config: Record<string, unknown> }[] }) =>
  exp
    .layerGroups!.filter(
      (g) =>
        sectionsAfter(g.config) === undefined ||
        (g.config.rope_scaling as { mrope_section?: unknown } | null)?.mrope_section === undefined,
    )
    .map((g) => g.kind);

describe("layer-group blocks signed without the model's sections", () => {
  it("1.1.0 before no_rope groups kept them: only the no_rope group's block is named, on the export and the page", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    // The no_rope group's block was written by hand as rope_scaling: null (server/features/plans/group-results.ts
    // before its block came from patchWithBase); the rotating groups already kept the sections.
    const { id, exp, page } = await signedOld(researcher, approver, "ntk", (stored) => ({
      ...stored,
      engineVersion: "rw-engine/1.1.0",
      results: {
        ...stored.results,
        groups: stored.results.groups.map((g) =>
          g.kind === "no_rope" ? { ...g, patch: { ...g.patch, rope_scaling: null } } : g,
        ),
      },
    }));
    expect(groupsLosingSections(exp)).toEqual(["no_rope"]);
    expect(exp.cautions).toHaveLength(1);
    const [c] = exp.cautions!;
    expect(c.code).toBe(CODE);
    expect(c.group).toBe("no_rope");
    // no_rope layers have no ropeParametersByLayerType entry (server/engine/layer-nesting.ts), so only the config
    expect(c.message).toContain(`The no_rope layer group's signed block (layerGroups' config) lacks "mrope_section"`);
    expect(c.message).toContain("rope_scaling is null, so applying it deletes the sections");
    expect(c.message).toContain("draft a new revision");
    // The way out is the one stack whose rigging runs a per-layer-type plan and keeps the sections in every layer
    // type's entry (tests/unit/engine/targets/sections-keeping-layered.test.ts); the flat stacks run no layered plan.
    expect(c.message).toContain("Export it with ?target=<stack> (transformers-v5), whose rigging keeps the sections");
    // The plan target's block kept them; the page lists the group's caution once, in the export's words.
    expect(page.blockCautions).toEqual([{ stage: null, ...c }]);
    // Every export of the revision carries the group blocks, so a stack's rigging says it too.
    const rigged = exportEnvelopeSchema.parse(
      (await researcher.get(`/api/plans/${id}/approved/export?target=transformers-v5`).expect(200)).body,
    );
    expect(rigged.cautions).toEqual(exp.cautions);
  });

  it("engine 1.0: the plan target's block and each group's are named, the rotating ones with their v5 entry", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const { exp, page } = await signedOld(researcher, approver, "linear", (stored) => ({
      ...stored,
      engineVersion: "rw-engine/1.0.0",
      results: {
        ...stored.results,
        final: { ...stored.results.final, patch: withoutSections(stored.results.final.patch) },
        groups: stored.results.groups.map((g) => ({ ...g, patch: withoutSections(g.patch) })),
      },
    }));
    const losing = groupsLosingSections(exp);
    expect(losing).toEqual(["sliding_attention", "full_attention", "no_rope"]);
    // the v5 entries built from those blocks lack them too: the caution is about both
    for (const kind of ["sliding_attention", "full_attention"])
      expect(exp.ropeParametersByLayerType![kind].mrope_section, kind).toBeUndefined();

    expect(exp.cautions!.map((c) => [c.code, c.group])).toEqual([
      [CODE, undefined],
      ...losing.map((kind) => [CODE, kind]),
    ]);
    const byKind = Object.fromEntries(exp.cautions!.map((c) => [c.group ?? "target", c.message]));
    expect(byKind.target).toContain(`This signed block lacks "mrope_section"`);
    expect(byKind.sliding_attention).toContain(
      "The sliding_attention layer group's signed block (layerGroups' config and " +
        'ropeParametersByLayerType.sliding_attention) lacks "mrope_section"',
    );
    expect(byKind.sliding_attention).toContain("rope_scaling is null");
    expect(byKind.full_attention).toContain("ropeParametersByLayerType.full_attention) lacks");
    expect(byKind.full_attention).toContain("applying it as a whole rope_scaling block drops them");
    expect(byKind.no_rope).toContain("(layerGroups' config) lacks");
    for (const message of Object.values(byKind)) expect(message).toContain("?target=<stack> (transformers-v5)");
    expect(page.blockCautions).toEqual(exp.cautions!.map((c) => ({ stage: null, ...c })));
  });
});
