import fs from "node:fs";
import { hashContent } from "../../server/features/plans/revision-content";
import type { Agent } from "./app";
import { ownerTestDb } from "./db";
import { configFixture } from "./import-config";
import { createPlan, post, twoStageRevision } from "./plans";

/*
 * Shared by the tests of signed blocks that lack a multimodal model's sections (issue 11): tests/api/plans/
 * frozen-sections*.test.ts and tests/e2e/signed-block-cautions.e2e.test.ts, which used to repeat these steps each.
 */

/** The hand-written contiguous config with the older `type: "mrope"` block, sections [16, 24, 24]. */
export const CONTIGUOUS_SECTIONS = "mrope-sections-contiguous.json";
/** The layered multimodal config: sliding and full-attention layers and one without position encoding. */
export const LAYERED_SECTIONS = "sliding-full-nope-mrope-sections.json";

/** A fixture config's bytes, as a researcher uploads it. */
export const fixtureBytes = (file: string) => fs.readFileSync(configFixture(file));

/** Imports and saves the fixture as a model profile named `<prefix>-<random>`; answers its id. */
export async function importSectionedModel(a: Agent, file: string, prefix: string) {
  const r = await a
    .post("/api/models/import?save=true")
    .set("X-CSRF-Token", a.csrf)
    .field(
      "overrides",
      JSON.stringify({ name: `${prefix}-${Math.random().toString(36).slice(2, 8)}`, parameters: 7e9 }),
    )
    .attach("file", fixtureBytes(file), "config.json")
    .expect(201);
  return r.body.saved.id as number;
}

/**
 * A two-stage revision on a model trained to 32 768: stage 1 moves the base to 65 536 (NTK), stage 2 and the plan
 * target stretch to 131 072 (linear, s = 4).
 */
export const ntkThenLinearRevision = () => {
  const r = twoStageRevision();
  return {
    ...r,
    targetContext: 131072,
    method: { method: "linear" },
    stages: [
      { ...r.stages[0], targetContext: 65536, sequenceLength: 65536, method: { method: "ntk" } },
      { ...r.stages[1], targetContext: 131072, sequenceLength: 131072, method: { method: "linear" } },
    ],
    acceptance: [{ ...r.acceptance[0], contextLength: 131072 }],
  };
};

/** A plan titled `<title> <random>` on the model with `revision`, sent to inspection; answers its id and revision 1's path. */
export async function submittedPlan(researcher: Agent, modelId: number, revision: object, title: string) {
  const { id } = await createPlan(researcher, modelId, {
    title: `${title} ${Math.random().toString(36).slice(2, 7)}`,
    revision,
  });
  const base = `/api/plans/${id}/revisions/1`;
  await post(researcher, `${base}/submit`).expect(200);
  return { id, base };
}

/**
 * "Ages" the plan's one stored revision to what an older engine froze: `transform` answers the old content (with its
 * engineVersion), which is written as the owner role with its own valid hash, so a later approval signs that hash.
 * Answers the revision row's id and the new hash.
 */
export async function rewriteStoredContent<T extends { engineVersion: string }>(
  planId: number,
  // the stored JSON, shaped by each test as it needs
  transform: (stored: any) => T,
) {
  const owner = ownerTestDb();
  const row = await owner.pool.query("SELECT id, content FROM plan_revisions WHERE plan_id = $1", [planId]);
  if (row.rows.length !== 1) throw new Error(`plan ${planId} has ${row.rows.length} revisions, expected one`);
  const revisionId = row.rows[0].id as number;
  const content = transform(row.rows[0].content);
  const hash = hashContent(content);
  await owner.pool.query(
    "UPDATE plan_revisions SET content = $1, content_hash = $2, engine_version = $3 WHERE id = $4",
    [content, hash, content.engineVersion, revisionId],
  );
  return { revisionId, hash };
}
