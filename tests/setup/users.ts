import crypto from "node:crypto";
import bcrypt from "bcryptjs";
import { insertUser } from "../../server/features/users/users.repo";
import type { Role } from "../../shared/schemas";
import { testDb } from "./db";

export const TEST_PASSWORD = "test-password-123";
// One real bcrypt hash per worker (cost 12 as in production), reused so tests stay fast.
let hash: Promise<string> | undefined;

export interface TestUser {
  id: number;
  email: string;
  name: string;
  password: string;
  roles: Role[];
}

export async function createTestUser(roles: Role[], name = `Tester ${roles.join("+")}`): Promise<TestUser> {
  hash ??= bcrypt.hash(TEST_PASSWORD, 12);
  const email = `t-${crypto.randomBytes(5).toString("hex")}@example.test`;
  const row = await insertUser(testDb().db, { email, name, roles, passwordHash: await hash });
  return { id: row.id, email: row.email, name: row.name, password: TEST_PASSWORD, roles };
}
