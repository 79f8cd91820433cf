import crypto from "node:crypto";
import bcrypt from "bcryptjs";
import { insertUser } from "../../server/features/users/users.repo";
import type { Role } from "../../shared/schemas";
import { testDb } from "./db";
import { loadConfig } from "../../server/config";

export const TEST_PASSWORD = "test-password-123";
// One real bcrypt hash per worker at the app's test cost (sign-in compares at the stored hash's cost), reused.
let hash: Promise<string> | undefined;

export interface TestUser {
  id: number;
  email: string;
  name: string;
  password: string;
  roles: Role[];
}

export async function createTestUser(roles: Role[], name = `Tester ${roles.join("+")}`): Promise<TestUser> {
  hash ??= bcrypt.hash(TEST_PASSWORD, loadConfig({ NODE_ENV: "test" }).bcryptCost);
  const email = `t-${crypto.randomBytes(5).toString("hex")}@example.test`;
  const row = await insertUser(testDb().db, { email, name, roles, passwordHash: await hash });
  return { id: row.id, email: row.email, name: row.name, password: TEST_PASSWORD, roles };
}
