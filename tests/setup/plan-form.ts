import type { Page } from "playwright-core";

/**
 * From the plans list: the new-plan form with a model found through the picker's search (the picker offers one page
 * of profiles), one method to `target`, saved as a draft. Returns the new plan's id, read from the plan page's URL.
 */
export async function draftPlanInForm(
  page: Page,
  plan: { title: string; modelName: string; method: string; target: number },
): Promise<number> {
  await page.getByRole("link", { name: "New plan" }).click();
  const form = page.getByRole("form", { name: "New plan" });
  await form.waitFor();
  await form.getByLabel("Title").fill(plan.title);
  await page.getByLabel("Find a model profile").fill(plan.modelName);
  await form.getByLabel("Model", { exact: true }).selectOption({ label: plan.modelName });
  await form.getByLabel("Method", { exact: true }).selectOption(plan.method);
  await form.getByLabel("Target context (tokens)").first().fill(String(plan.target));
  await form.getByRole("button", { name: "Save draft" }).click();
  await page.waitForURL(/\/plans\/\d+$/);
  return Number(new URL(page.url()).pathname.split("/").pop());
}
