import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, screenshot, requireBuiltClient, submitSignIn } from "../setup/browser";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let admin: TestUser;

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, admin] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["admin"], "Ada Admin"),
  ]);
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
});

const navLabels = (page: Page) => page.getByRole("navigation", { name: "Main" }).getByRole("link").allTextContents();

// Screens shown only to some roles (the issues' rules, written out by hand): Users and Mail for admins,
// Inspection (the review queue) for approvers, Audit for admins and approvers. Everything else is for everyone signed in.
const RESTRICTED = ["Users", "Inspection", "Audit", "Mail"];
const restricted = (labels: string[]) => labels.filter((l) => RESTRICTED.includes(l));

describe("foundation screens in a browser", () => {
  it("admin creates a two-role user; that user sees only what the roles allow", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();
    const pageErrors: string[] = [];
    page.on("pageerror", (e) => pageErrors.push(e.message));
    // Console errors catch CSP refusals and React warnings; the browser's own line for the expected 401/409 is not one.
    page.on("console", (m) => {
      if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) pageErrors.push(m.text());
    });

    // A signed-out visit to /users lands on sign-in and returns to /users afterwards.
    await page.goto(`${server.url}/users`);
    await page.waitForURL(/\/sign-in\?next=%2Fusers$/);
    // The URL changes before the sign-in screen has drawn: wait for its heading to be visible, not a look at once.
    await page.getByRole("heading", { name: "Sign in to Ropewalk" }).waitFor({ state: "visible" });
    await screenshot(page, "sign-in");

    // A wrong password is refused with a message and no navigation.
    await submitSignIn(page, { email: admin.email, password: "not-the-password" });
    await page.getByText("do not match an active account").waitFor();
    expect(new URL(page.url()).pathname).toBe("/sign-in");

    await submitSignIn(page, admin);
    await page.waitForURL(`${server.url}/users`);
    await page.getByRole("heading", { level: 1, name: "Users" }).waitFor();
    const adminNav = await navLabels(page);
    expect(adminNav[0]).toBe("Home");
    expect(adminNav.at(-1)).toBe("Profile");
    expect(restricted(adminNav)).toEqual(["Users", "Audit", "Mail"]);

    // The form's own validation (shared zod schema) speaks before the server is asked.
    await page.getByRole("button", { name: "Add user" }).click();
    await page.getByText("pick at least one role").waitFor();

    const email = `rw-${Date.now()}@example.test`;
    const password = "strand-laid-tight-42";
    const form = page.getByRole("form", { name: "Add a user" });
    await form.getByLabel("Name").fill("Rosa Researcher");
    await form.getByLabel("E-mail").fill(email);
    await form.getByLabel("First password").fill(password);
    await form.getByLabel(/^Researcher/).check();
    await form.getByLabel(/^Approver/).check();
    await form.getByRole("button", { name: "Add user" }).click();
    await page.getByText(`Added Rosa Researcher (${email})`).waitFor();

    // The new row appears in the table with both roles; the text filter narrows to it.
    // The list is paged by the server, so the server's search finds her wherever she sorts.
    await page.getByLabel("Find a person").fill("rosa");
    const rows = page.getByRole("table", { name: "Users" }).locator("tbody tr");
    await expect.poll(() => rows.count()).toBe(1);
    await expect(rows.first().textContent()).resolves.toMatch(/Rosa Researcher.*Researcher.*Approver/);
    await page.getByLabel("Find a person").fill("");

    // Creating the same e-mail again puts the server's 409 beside the E-mail field.
    await form.getByLabel("Name").fill("Rosa Again");
    await form.getByLabel("E-mail").fill(email);
    await form.getByLabel("First password").fill(password);
    await form.getByLabel(/^Viewer/).check();
    await form.getByRole("button", { name: "Add user" }).click();
    await form.getByText("already taken").waitFor();
    await screenshot(page, "users");

    await page.getByRole("link", { name: "Profile", exact: true }).click();
    await page.getByRole("heading", { level: 1, name: "Profile" }).waitFor();
    await screenshot(page, "profile");

    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(`${server.url}/sign-in`);

    // The new user: only what researcher + approver allow, and a plain refusal at /users.
    await submitSignIn(page, { email, password });
    await page.waitForURL(`${server.url}/`);
    await page.getByRole("heading", { name: "Good to see you, Rosa Researcher" }).waitFor();
    // Researcher + approver: the review queue and the audit trail, never the admin screens.
    const rosaNav = await navLabels(page);
    expect(rosaNav).toContain("Home");
    expect(rosaNav).toContain("Profile");
    expect(restricted(rosaNav)).toEqual(["Inspection", "Audit"]);
    const roles = await page.getByLabel("Your roles").textContent();
    expect(roles).toContain("Researcher");
    expect(roles).toContain("Approver");
    expect(roles).not.toContain("Admin");
    await screenshot(page, "home");

    await page.goto(`${server.url}/users`);
    const refusal = page.getByTestId("not-allowed");
    await refusal.waitFor();
    await expect.poll(() => refusal.textContent()).toContain("not allowed for your roles");
    await expect(page.getByRole("table").count()).resolves.toBe(0);
    await screenshot(page, "not-allowed");

    await page.goto(`${server.url}/no-such-place`);
    await page.getByRole("heading", { name: "Page not found" }).waitFor();
    await screenshot(page, "not-found");

    expect(pageErrors).toEqual([]);
    await context.close();
  }, 60_000);
  it("a user changes their own password; errors land beside the fields", async () => {
    const viewer = await createTestUser(["viewer"], "Vic Viewer");
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(`${server.url}/profile`);
    await submitSignIn(page, viewer);
    await page.waitForURL(`${server.url}/profile`);
    const form = page.getByRole("form", { name: "Change password" });
    const newPassword = "a-brand-new-rope-77";

    // Client-side check from the shared schema plus the typed-twice rule.
    await form.getByLabel("Current password").fill(viewer.password);
    await form.getByLabel("New password", { exact: true }).fill(newPassword);
    await form.getByLabel("New password, again").fill("something-else-entirely");
    await form.getByRole("button", { name: "Change password" }).click();
    await form.getByText("does not match the new password").waitFor();

    // The server's 400 with fields: the wrong current password is flagged on its own input.
    await form.getByLabel("Current password").fill("wrong-current-password");
    await form.getByLabel("New password, again").fill(newPassword);
    await form.getByRole("button", { name: "Change password" }).click();
    await form.getByText("Current password does not match.", { exact: true }).waitFor();
    const current = form.getByLabel("Current password");
    expect(await current.getAttribute("aria-invalid")).toBe("true");
    // The message is the one wired to that input, not a banner elsewhere.
    const errorId = (await current.getAttribute("aria-describedby"))?.split(" ").find((id) => id.endsWith("-error"));
    expect(await page.locator(`[id="${errorId}"]`).textContent()).toBe("Current password does not match.");

    await form.getByLabel("Current password").fill(viewer.password);
    await form.getByRole("button", { name: "Change password" }).click();
    await page.getByText("Password changed.").waitFor();

    // The new password is the one that works now.
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(`${server.url}/sign-in`);
    await submitSignIn(page, viewer);
    await page.getByText("do not match an active account").waitFor();
    await submitSignIn(page, { email: viewer.email, password: newPassword });
    await page.waitForURL(`${server.url}/`);
    await context.close();
  }, 60_000);

  it("admin changes a user's roles, sorts the table, and deactivates the account", async () => {
    const target = await createTestUser(["viewer"], "Vera Viewer");
    const adminContext = await browser.newContext({ viewport: { width: 1280, height: 860 } });
    const page = await adminContext.newPage();
    await page.goto(`${server.url}/users`);
    await submitSignIn(page, admin);
    await page.getByRole("heading", { level: 1, name: "Users" }).waitFor();

    const table = page.getByRole("table", { name: "Users" });
    const nameHeader = table.getByRole("columnheader", { name: /Name/ });
    expect(await nameHeader.getAttribute("aria-sort")).toBe("ascending");
    await nameHeader.getByRole("button").click();
    await expect.poll(() => nameHeader.getAttribute("aria-sort")).toBe("descending");

    await page.getByLabel("Find a person").fill(target.email);
    const row = table.locator("tbody tr").filter({ hasText: target.email });
    await page.getByRole("button", { name: "Change roles of Vera Viewer" }).click();
    const editor = page.getByRole("form", { name: "Roles of Vera Viewer" });
    await editor.getByLabel(/^Infra lead/).check();
    await editor.getByRole("button", { name: "Save roles" }).click();
    await editor.waitFor({ state: "detached" });
    // The editor closes with the save's answer; the row shows the new roles once the list has been read again.
    await expect.poll(() => row.textContent()).toMatch(/Infra lead.*Viewer|Viewer.*Infra lead/);

    await page.getByRole("button", { name: "Deactivate Vera Viewer" }).click();
    await page.getByText("Vera Viewer is deactivated").waitFor();
    await expect.poll(() => row.textContent()).toContain("Deactivated");

    // A deactivated account cannot sign in.
    const other = await browser.newContext();
    const second = await other.newPage();
    await second.goto(`${server.url}/sign-in`);
    await submitSignIn(second, target);
    await second.getByText("do not match an active account").waitFor();
    await other.close();

    await page.getByRole("button", { name: "Reactivate Vera Viewer" }).click();
    await page.getByText("Vera Viewer is active again").waitFor();
    await adminContext.close();
  }, 60_000);
});
