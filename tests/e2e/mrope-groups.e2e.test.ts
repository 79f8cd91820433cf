import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, requireBuiltClient, screenshot } from "../setup/browser";
import { importConfigThroughUi } from "../setup/import-config";
import { draftPlanInForm } from "../setup/plan-form";
import { startTestServer } from "../setup/server";
import { signedInPages } from "../setup/signed-in";
import { createTestUser, type TestUser } from "../setup/users";

/*
 * Issue 11 through the screens: multimodal sections shown as bands over the pair axis in the workbench and, on a plan
 * that scales them, which axis each section rotates and how many of its pairs are flagged; then a layered model's
 * per-group flags on the plan page and in the report. Every figure below is worked by hand in the comments.
 *
 * Which axis a pair rotates by (shared/mrope-axes.ts cites the loaders):
 * - contiguous: huggingface/transformers src/transformers/models/qwen2_vl/modeling_qwen2_vl.py,
 *   apply_multimodal_rotary_pos_emb: block i of `mrope_section` pairs takes axis i % 3;
 * - interleaved: src/transformers/models/qwen3_vl/modeling_qwen3_vl.py, apply_interleaved_mrope: every pair starts
 *   temporal; j ≡ 1 (mod 3) with j < 3·section[1] is height, j ≡ 2 (mod 3) with j < 3·section[2] is width.
 *
 * Flags (docs/rotary-scaling.md), with λ_i = 2π·b^(2i/d), r_i = L/λ_i, α = 1, β = 32 (the default bands):
 * - never completes a period in the trained window: λ_i > L;
 * - unseen angles: that, and L′·θ′_i > L·θ_i;
 * - compressed resolution: r_i ≥ β and θ′_i < θ_i.
 * The plans use NTK-aware scaling (Peng et al. 2023, §3.1, Eq. 16): b′ = b·s^(d/(d−2)), so θ′_i/θ_i = s^(−2i/(d−2)).
 * Pair 0 keeps its frequency (not compressed); the last pair i = d/2 − 1 is divided by exactly s, so with s = L′/L
 * its largest angle is the trained one (not unseen); every pair between is slowed by less than s.
 */

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let researcher: TestUser;
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
);
const stamp = Date.now().toString(36);

/** 65 536 as the screens group digits (a comma, a space or none, by locale). */
const count = (n: number) => String(n).replace(/(\d+)(\d{3})$/, "$1[,\\s\\u202f]?$2");
/** pairs from..to stepping by `step`, as the screens list them ("1, 4, 7"). */
const every = (from: number, to: number, step: number) =>
  Array.from({ length: Math.floor((to - from) / step) + 1 }, (_, k) => from + k * step);

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, researcher] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher"], "Sasha Sections"),
  ]);
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await server?.close();
});

/** The report the plan page opens in a new tab. */
async function openReport(page: Page): Promise<Page> {
  const [report] = await Promise.all([
    page.waitForEvent("popup"),
    page.getByRole("link", { name: "Open report" }).click(),
  ]);
  await report
    .getByRole("heading", { level: 2, name: /Layer groups|Multimodal sections/ })
    .first()
    .waitFor();
  return report;
}

/** The text of each item of the plan page's or the report's list of position axes, by axis. */
async function axisItems(scope: Page, testId?: string) {
  const root = testId ? scope.getByTestId(testId) : scope.locator("body");
  const out: Record<string, string> = {};
  for (const axis of ["temporal", "height", "width"]) {
    const item = root.locator(`li[data-axis="${axis}"]`);
    out[axis] = (await item.count()) ? ((await item.textContent()) ?? "").replace(/\s+/g, " ").trim() : "";
  }
  return out;
}

describe("multimodal sections: bands over the pair axis, and what a plan that scales them flags", () => {
  it("contiguous [16, 24, 24]: the workbench bands the pairs, the plan page says each axis's flags", async () => {
    const modelName = `Three-strand blocks ${stamp}`;
    const page = await signedIn(researcher, "/models/import");
    // hidden 3584 / 28 heads = d 128: 64 pairs, and 16 + 24 + 24 = 64, so the import raises no section warning
    await importConfigThroughUi(page, "mrope-sections-contiguous.json", modelName);

    await page.getByRole("link", { name: "Open in the workbench" }).click();
    const axes = page.getByRole("list", { name: "Position axis of each pair" });
    await axes.waitFor({ timeout: 20_000 });
    // blocks in order: pairs 0–15 temporal, 16–39 height, 40–63 width
    expect(await axes.getByRole("listitem").allTextContents()).toEqual([
      "temporal: 16 pairs (0–15)",
      "height: 24 pairs (16–39)",
      "width: 24 pairs (40–63)",
    ]);
    // the strip along the pair axis: three adjacent bands whose widths go 16 : 24 : 24. The list above is words; the
    // strip is drawn in the wavelength chart, which comes once visx ParentSize has measured its frame.
    const bands = page.getByTestId("mrope-bands").locator("g[data-axis]");
    await bands.first().waitFor({ timeout: 20_000 });
    expect(await bands.evaluateAll((gs) => gs.map((g) => g.getAttribute("data-axis")))).toEqual([
      "temporal",
      "height",
      "width",
    ]);
    const rects = await bands
      .locator("rect")
      .evaluateAll((rs) => rs.map((r) => ({ x: Number(r.getAttribute("x")), w: Number(r.getAttribute("width")) })));
    const pairWidth = rects[0].w / 16;
    expect(rects[1].w / pairWidth).toBeCloseTo(24, 6);
    expect(rects[2].w / pairWidth).toBeCloseTo(24, 6);
    expect(rects[1].x).toBeCloseTo(rects[0].x + rects[0].w, 6);
    expect(rects[2].x).toBeCloseTo(rects[1].x + rects[1].w, 6);
    await screenshot(page, "mrope-workbench-contiguous");

    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Plans", exact: true }).click();
    await draftPlanInForm(page, { modelName, title: `Three-strand blocks ×4 ${stamp}`, method: "ntk", target: 131072 });
    await page.getByTestId("mrope-axes").waitFor({ timeout: 15_000 });
    /*
     * b = 10⁶, d = 128, L = 32 768, L′ = 131 072 (s = 4).
     * λ_i > L ⇔ 10^(6i/64) > 32 768/2π = 5 215.2 ⇔ i > 64·3.7173/6 = 39.65: pairs 40–63 never complete a period;
     * unseen: 40–62 (the last pair is divided by exactly s), 23 pairs, all in the width block.
     * r_i ≥ 32 ⇔ λ_i ≤ 1 024 ⇔ 10^(6i/64) ≤ 162.97 ⇔ i ≤ 64·2.2121/6 = 23.6: pairs 0–23 spin; compressed: 1–23
     * (pair 0 keeps its frequency), so temporal 1–15 = 15, height 16–23 = 8, width none.
     */
    expect(await axisItems(page, "mrope-axes")).toEqual({
      temporal: "temporal: 16 pairs (0–15); 0 with unseen angles, 15 with compressed resolution",
      height: "height: 24 pairs (16–39); 0 with unseen angles, 8 with compressed resolution",
      width: "width: 24 pairs (40–63); 23 with unseen angles, 0 with compressed resolution",
    });
    expect(await page.getByTestId("mrope-axes").textContent()).toContain(
      "mrope_section [16, 24, 24], in contiguous blocks (temporal, height, width)",
    );
    // The rigging keeps the model's sections, which its attention layers read on every step (server/engine/targets/
    // hf/compile.ts cites where): NTK-aware goes out as a new base, so rope_scaling stays as a "default" block holding
    // mrope_section instead of being removed.
    const artifact = page.getByTestId("target-artifact-text");
    await expect.poll(() => artifact.textContent()).toContain('"rope_scaling"');
    const patch = JSON.parse((await artifact.textContent()) ?? "{}");
    expect(patch.rope_scaling).toMatchObject({ rope_type: "default" });
    expect(patch.rope_scaling).not.toHaveProperty("mrope_section", null);
    // The revision's frozen block (the export envelope's `config`) keeps them as well, in the same default block.
    const frozen = JSON.parse((await page.getByTestId("signed-block").textContent()) ?? "{}");
    expect(frozen.rope_scaling).toEqual({ rope_type: "default", type: "default", mrope_section: [16, 24, 24] });
    await screenshot(page, "mrope-plan-contiguous");

    const report = await openReport(page);
    expect(await axisItems(report)).toMatchObject({
      // the method by its name, as the plan page names it (not its id)
      temporal: expect.stringMatching(
        /^temporal: 16 pairs \(0–15\); the plan's NTK-aware base gives 0 of them unseen angles and 15 compressed/,
      ),
      height: expect.stringMatching(/^height: 24 pairs \(16–39\); .* 0 of them unseen angles and 8 compressed/),
      width: expect.stringMatching(/^width: 24 pairs \(40–63\); .* 23 of them unseen angles and 0 compressed/),
    });
  }, 150_000);

  it("interleaved [24, 20, 16]: the import warns of the sum; the bands alternate T H W; the plan page splits the flags", async () => {
    const modelName = `Three-strand laid ${stamp}`;
    const page = await signedIn(researcher, "/models/import");
    // head_dim 128: 64 pairs, but 24 + 20 + 16 = 60
    await importConfigThroughUi(page, "mrope-sections-interleaved-bad-sum.json", modelName, async () => {
      await expect
        .poll(() => page.getByTestId("import-warnings").textContent())
        .toContain("mrope_section [24, 20, 16] adds up to 60 pairs, but the rotary dimension 128 has 64.");
    });

    await page.getByRole("link", { name: "Open in the workbench" }).click();
    const axes = page.getByRole("list", { name: "Position axis of each pair" });
    await axes.waitFor({ timeout: 20_000 });
    // height: j ≡ 1 (mod 3), j < 60 → 1, 4, …, 58 (20); width: j ≡ 2 (mod 3), j < 48 → 2, 5, …, 47 (16);
    // temporal: the other 28 (0, 3, …, 48 by threes, then 50–51, 53–54, 56–57 and 59–63).
    const temporal = [...every(0, 48, 3).map(String), "50–51", "53–54", "56–57", "59–63"].join(", ");
    expect(await axes.getByRole("listitem").allTextContents()).toEqual([
      `temporal: 28 pairs (${temporal})`,
      `height: 20 pairs (${every(1, 58, 3).join(", ")})`,
      `width: 16 pairs (${every(2, 47, 3).join(", ")})`,
    ]);
    // the strip is drawn once the chart's frame has a width (visx ParentSize), after the list above
    const strip = page.getByTestId("mrope-bands").locator("g[data-axis]");
    await strip.first().waitFor({ timeout: 20_000 });
    const order = await strip.evaluateAll((gs) => gs.map((g) => g.getAttribute("data-axis")));
    // one band per pair up to 47 (T H W …), then 48 T, 49 H, 50–51 T, 52 H, 53–54 T, 55 H, 56–57 T, 58 H, 59–63 T
    expect(order.length).toBe(48 + 9);
    expect(order.slice(0, 6)).toEqual(["temporal", "height", "width", "temporal", "height", "width"]);
    expect(order.at(-1)).toBe("temporal");
    await screenshot(page, "mrope-workbench-interleaved");

    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Plans", exact: true }).click();
    await draftPlanInForm(page, { modelName, title: `Three-strand laid ×4 ${stamp}`, method: "ntk", target: 1048576 });
    await page.getByTestId("mrope-axes").waitFor({ timeout: 15_000 });
    /*
     * b = 5·10⁶, d = 128, L = 262 144, L′ = 1 048 576 (s = 4).
     * λ_i > L ⇔ (5·10⁶)^(i/64) > 41 721.5 ⇔ i > 64·4.6204/6.6990 = 44.1: pairs 45–63; unseen 45–62:
     *   temporal 45, 48, 51, 54, 57, 60 and 50, 53, 56, 59, 62 and 61 = 12; height 46, 49, 52, 55, 58 = 5; width 47 = 1.
     * r_i ≥ 32 ⇔ λ_i ≤ 8 192 ⇔ (5·10⁶)^(i/64) ≤ 1 303.8 ⇔ i ≤ 64·3.1152/6.6990 = 29.8: compressed 1–29:
     *   temporal 3, 6, …, 27 = 9; height 1, 4, …, 28 = 10; width 2, 5, …, 29 = 10.
     */
    expect(await axisItems(page, "mrope-axes")).toEqual({
      temporal: `temporal: 28 pairs (${temporal}); 12 with unseen angles, 9 with compressed resolution`,
      height: `height: 20 pairs (${every(1, 58, 3).join(", ")}); 5 with unseen angles, 10 with compressed resolution`,
      width: `width: 16 pairs (${every(2, 47, 3).join(", ")}); 1 with unseen angles, 10 with compressed resolution`,
    });
    expect(await page.getByTestId("mrope-axes").textContent()).toContain(
      "mrope_section [24, 20, 16], interleaved (T H W T H W …)",
    );
    await screenshot(page, "mrope-plan-interleaved");
  }, 150_000);
});

describe("a layered model's flags per layer group, on the plan page and in the report", () => {
  it("full attention takes the plan's NTK-aware base, local layers stay as trained; each group is flagged on its own", async () => {
    const modelName = `Windowed strands ${stamp}`;
    const page = await signedIn(researcher, "/models/import");
    // layers 0–4 and 6–10 local (window 1 024, base 10 000), 5 and 11 full (base 10⁶); pre-trained 16 384
    await importConfigThroughUi(page, "sliding-full-local-base.json", modelName);
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Plans", exact: true }).click();
    await draftPlanInForm(page, { modelName, title: `Windowed strands to 64k ${stamp}`, method: "ntk", target: 65536 });
    const groups = page.getByTestId("group-results");
    await groups.waitFor({ timeout: 15_000 });
    /*
     * Full attention: b = 10⁶, d = 256, L = 16 384, L′ = 65 536 (s = 4).
     *   λ_i > L ⇔ 10^(6i/128) > 2 607.6 ⇔ i > 128·3.4162/6 = 72.9: pairs 73–127 (55); unseen 73–126 (54).
     *   r_i ≥ 32 ⇔ λ_i ≤ 512 ⇔ 10^(6i/128) ≤ 81.49 ⇔ i ≤ 128·1.9111/6 = 40.8: compressed 1–40 (40).
     * Local: b = 10 000, d = 256, as trained, checked only over its 1 024-token window: θ′ = θ and L′ < L, so no pair
     *   is unseen or compressed; λ_i > 16 384 ⇔ 10^(4i/128) > 2 607.6 ⇔ i > 128·3.4162/4 = 109.3: pairs 110–127 (18).
     */
    const full = (await groups.locator('tr[data-kind="full_attention"]').textContent()) ?? "";
    expect(full).toContain("takes the plan's method");
    expect(full).toMatch(new RegExp(`checked up to ${count(65536)} tokens`));
    expect(full).toContain(
      "unseen angles on 54 pairs (73–126); compressed resolution on 40 pairs (1–40); 55 pairs (73–127) never complete a period in the trained window",
    );
    const local = (await groups.locator('tr[data-kind="sliding_attention"]').textContent()) ?? "";
    expect(local).toContain("kept as trained");
    expect(local).toMatch(new RegExp(`checked up to ${count(1024)} tokens`));
    expect(local).toContain(
      "no pair sees unseen angles or compressed resolution; 18 pairs (110–127) never complete a period in the trained window",
    );
    await screenshot(page, "groups-plan-page");

    const report = await openReport(page);
    const cells = async (kind: string) =>
      (await report.locator(`tr[data-kind="${kind}"] td`).allTextContents()).map((t) => t.trim());
    expect(await cells("full_attention")).toEqual([
      "full_attention (2 layers: 5, 11)",
      "1000000",
      "256",
      "—",
      "NTK-aware base (the plan's method)",
      "65536",
      "73–126",
      "1–40",
      "73–127",
    ]);
    expect(await cells("sliding_attention")).toEqual([
      "sliding_attention (10 layers: 0–4, 6–10)",
      "10000",
      "256",
      "1024",
      "No rescaling (as trained)",
      "1024",
      "none",
      "none",
      "110–127",
    ]);
    await screenshot(report, "groups-report");
    expect(errors).toEqual([]);
  }, 150_000);
});
