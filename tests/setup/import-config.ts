import path from "node:path";
import type { Page } from "playwright-core";

/** A hand-written config under tests/fixtures/configs, by file name. */
export const configFixture = (file: string) => path.resolve(import.meta.dirname, "../fixtures/configs", file);

/**
 * Imports a config.json the way a researcher does: the import screen (the page must be on /models/import), the file
 * picker, the preview's form, "Save profile"; resolves once the new profile's page shows `name` as its heading.
 * `onPreview` runs between the preview and the save, for a test that checks what the preview shows.
 * Shared by the browser tests of issue 11 (layouts, lineage, multimodal sections and layer groups), which used to
 * repeat these steps each.
 */
export async function importConfigThroughUi(
  page: Page,
  file: string,
  name: string,
  onPreview?: (page: Page) => Promise<void>,
): Promise<void> {
  await page.getByRole("heading", { level: 1, name: "Import a config.json" }).waitFor();
  await page.getByLabel("config.json to import").setInputFiles(configFixture(file));
  const form = page.getByRole("form", { name: "Imported profile" });
  await form.waitFor();
  if (onPreview) await onPreview(page);
  await form.getByLabel("Name", { exact: true }).fill(name);
  await form.getByRole("button", { name: "Save profile" }).click();
  await page.getByRole("heading", { level: 1, name }).waitFor();
}
