import { execFile } from "node:child_process";
import path from "node:path";
import { promisify } from "node:util";
import { describe, expect, it } from "vitest";
import { testDb } from "../setup/db";

const run = promisify(execFile);
const root = path.resolve(import.meta.dirname, "../..");

describe("npm run create-admin", () => {
  it("creates an admin from flags, and refuses a short password without writing", async () => {
    const email = `first-admin-${Date.now()}@example.test`;
    const env = {
      ...process.env,
      DATABASE_URL: process.env.TEST_DATABASE_URL,
      MIGRATION_DATABASE_URL: process.env.TEST_MIGRATION_DATABASE_URL,
      NODE_ENV: "production",
      SESSION_SECRET: "x".repeat(32),
    };
    const ok = await run(
      "node",
      [
        "--import",
        "tsx",
        "scripts/create-admin.ts",
        "--email",
        email,
        "--name",
        "First Admin",
        "--password",
        "a-long-password-1",
      ],
      { cwd: root, env },
    );
    expect(ok.stdout).toContain(`admin created: ${email}`);
    const row = await testDb().pool.query("SELECT roles, active FROM users WHERE email = $1", [email]);
    expect(row.rows[0]).toEqual({ roles: ["admin"], active: true });
    const bad = await run(
      "node",
      ["--import", "tsx", "scripts/create-admin.ts", "--email", `x${email}`, "--name", "X", "--password", "short"],
      { cwd: root, env },
    ).catch((e) => e);
    expect(bad.code).toBe(1);
    expect(bad.stderr).toContain("password");
    expect((await testDb().pool.query("SELECT 1 FROM users WHERE email = $1", [`x${email}`])).rowCount).toBe(0);
  });

  it("in production refuses to migrate without MIGRATION_DATABASE_URL, naming it", async () => {
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      DATABASE_URL: process.env.TEST_DATABASE_URL,
      NODE_ENV: "production",
      SESSION_SECRET: "x".repeat(32),
    };
    delete env.MIGRATION_DATABASE_URL;
    const email = `no-owner-${Date.now()}@example.test`;
    const r = await run(
      "node",
      [
        "--import",
        "tsx",
        "scripts/create-admin.ts",
        "--email",
        email,
        "--name",
        "N",
        "--password",
        "a-long-password-1",
      ],
      { cwd: root, env },
    ).catch((e) => e);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain("MIGRATION_DATABASE_URL");
    expect((await testDb().pool.query("SELECT 1 FROM users WHERE email = $1", [email])).rowCount).toBe(0);
  });
});
