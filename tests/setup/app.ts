import crypto from "node:crypto";
import os from "node:os";
import path from "node:path";
import request from "supertest";
import type { Express } from "express";
import { createApp } from "../../server/app";
import { loadConfig, type Config } from "../../server/config";
import type { AppDeps } from "../../server/deps";
import type { Role } from "../../shared/schemas";
import { testDb } from "./db";
import { createTestUser, type TestUser } from "./users";

export type Agent = ReturnType<typeof request.agent> & { csrf: string; user?: TestUser };

/**
 * One signing key per test database, in the system temp folder (never the repo's .data): every worker of a run signs
 * and verifies with the same key, and two runs never share one.
 */
export const testSigningKeyFile = () =>
  path.join(
    os.tmpdir(),
    "ropewalk-test-keys",
    `${crypto
      .createHash("sha256")
      .update(process.env.TEST_DATABASE_URL ?? "none")
      .digest("hex")
      .slice(0, 16)}.pem`,
  );

export function testConfig(overrides: Partial<Config> = {}): Config {
  return loadConfig(
    {
      NODE_ENV: "test",
      DATABASE_URL: process.env.TEST_DATABASE_URL,
      LOGIN_LIMIT_PER_ADDRESS: "100000",
      SIGNING_KEY_FILE: testSigningKeyFile(),
    },
    overrides,
  );
}

/** A real app on the test database. `agentAs(roles)` signs a fresh user in and carries the CSRF header. */
export function makeTestApp(overrides: Partial<Config> = {}) {
  const { pool, db } = testDb();
  const deps: AppDeps = { config: testConfig(overrides), pool, db };
  const app = createApp(deps);

  async function agent(): Promise<Agent> {
    const a = request.agent(app) as Agent;
    const s = await a.get("/api/auth/session").expect(200);
    a.csrf = s.body.csrfToken;
    return a;
  }

  async function signIn(user: { email: string; password: string }): Promise<Agent> {
    const a = await agent();
    const r = await a.post("/api/auth/login").set("X-CSRF-Token", a.csrf).send(user);
    if (r.status !== 200) throw new Error(`sign-in failed: ${r.status} ${JSON.stringify(r.body)}`);
    a.csrf = r.body.csrfToken;
    return a;
  }

  async function agentAs(roles: Role[]): Promise<Agent> {
    const user = await createTestUser(roles);
    const a = await signIn(user);
    a.user = user;
    return a;
  }

  return { app: app as Express, deps, agent, signIn, agentAs };
}
