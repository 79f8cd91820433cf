import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, requireBuiltClient, SCREENSHOT_DIR } from "../setup/browser";
import { makeTestApp } from "../setup/app";
import {
  importSectionedModel,
  LAYERED_SECTIONS,
  ntkThenLinearRevision,
  rewriteStoredContent,
  submittedPlan,
} from "../setup/frozen-sections";
import { decide } from "../setup/plans";
import { startTestServer } from "../setup/server";
import { signedInPages } from "../setup/signed-in";

/*
 * The plan page's "Frozen config block" panel names every signed block of an older revision that lacks the model's
 * multimodal sections (issue 11, shared/frozen-block.ts): here a stage's block and two layer groups' blocks of a
 * layered multimodal model. The old revision is faked the way tests/api/plans/frozen-sections-stages.test.ts and
 * frozen-sections-group-cautions.test.ts fake one: blocks as the older engine froze them (rope_scaling: null, as
 * patchWithBase wrote before engine 1.1 and the no_rope group's hand-written block did before it came from
 * patchWithBase), written in review with their own valid hash, then signed. The notices must read at a desktop width
 * (1440 px) and a phone width (390 px) without sideways scrolling; element pictures of the panel are kept in
 * artifacts/screenshots/ for people to look at.
 */
const { agentAs } = makeTestApp();
let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
);

beforeAll(async () => {
  requireBuiltClient();
  [server, browser] = await Promise.all([startTestServer(), launchBrowser()]);
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await server?.close();
});

type Block = { patch: { rope_scaling: unknown } } & Record<string, unknown>;
const nulled = (b: Block) => ({ ...b, patch: { ...b.patch, rope_scaling: null } });

/** A two-stage NTK-then-linear plan on the layered multimodal fixture, signed with stage 1's and two groups' blocks old. */
async function oldSignedPlan() {
  const researcher = await agentAs(["researcher"]);
  const approver = await agentAs(["approver"]);
  const modelId = await importSectionedModel(researcher, LAYERED_SECTIONS, "Notices");
  const { id, base } = await submittedPlan(researcher, modelId, ntkThenLinearRevision(), "Old signed blocks");
  await rewriteStoredContent(id, (stored) => {
    const [s1, s2] = stored.results.stages as Block[];
    return {
      ...stored,
      engineVersion: "rw-engine/1.0.0",
      results: {
        ...stored.results,
        stages: [nulled(s1), s2],
        groups: (stored.results.groups as (Block & { kind: string })[]).map((g) =>
          g.kind === "sliding_attention" || g.kind === "no_rope" ? nulled(g) : g,
        ),
      },
    };
  });
  await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);
  return { id, researcher: researcher.user! };
}

/** The "Frozen config block" panel. */
const panelOf = (page: Page) =>
  page.getByRole("heading", { name: "Frozen config block", level: 2 }).locator("xpath=ancestor::section[1]");

describe("the plan page names each old signed block that lacks the sections", () => {
  it("a stage's notice and each group's, readable at 1440 and 390 px", async () => {
    const { id, researcher } = await oldSignedPlan();
    for (const width of [1440, 390]) {
      const page = await signedIn(researcher, `/plans/${id}`, width);
      const panel = panelOf(page);
      const notices = panel.getByTestId("signed-block-cautions").getByRole("alert");
      await notices.first().waitFor();
      // The blocks faked old are exactly the ones named: stage 1's, then the sliding and no_rope groups'; the plan
      // target's block, stage 2's and the full-attention group's kept the sections and draw none.
      await expect
        .poll(() => notices.locator("p.font-semibold").allTextContents())
        .toEqual([
          "Stage 1's signed block lacks the model's sections",
          "The sliding_attention layer group's signed block lacks the model's sections",
          "The no_rope layer group's signed block lacks the model's sections",
        ]);
      const stage = panel.locator('p[data-code="frozen_config_lacks_sections"][data-stage="1"]');
      await expect(stage.textContent()).resolves.toContain(`Stage 1's signed block lacks "mrope_section"`);
      const sliding = panel.locator('p[data-group="sliding_attention"]');
      await expect(sliding.textContent()).resolves.toContain("ropeParametersByLayerType.sliding_attention");
      const noRope = panel.locator('p[data-group="no_rope"]');
      await expect(noRope.textContent()).resolves.toContain("(layerGroups' config) lacks");

      // No sideways scroll: the page is no wider than the window, and each notice fits inside the panel.
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow, `${width}px page`).toBeLessThanOrEqual(0);
      const box = (await panel.boundingBox())!;
      for (const n of await notices.all()) {
        const b = (await n.boundingBox())!;
        expect(b.x + b.width, `${width}px notice`).toBeLessThanOrEqual(box.x + box.width + 0.5);
        const wide = await n.evaluate((el) => el.scrollWidth - el.clientWidth);
        expect(wide, `${width}px notice text`).toBeLessThanOrEqual(0);
      }
      fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
      await panel.screenshot({
        path: path.join(SCREENSHOT_DIR, `signed-block-cautions-${width}.png`),
        animations: "disabled",
      });
      await page.close();
    }
    expect(errors).toEqual([]);
  });
});
