import path from "node:path";
import { fileURLToPath } from "node:url";
import bcrypt from "bcryptjs";
import { sql } from "drizzle-orm";
import type { Db } from "./client";
import type { AppDeps } from "../deps";
import { users } from "./schema";
import { recordAudit } from "../platform/audit";
import type { Role } from "../../shared/schemas";
import { seedModelProfiles } from "../features/models/models.seed";
import { seedAccelerators } from "../features/accelerators/accelerators.seed";
import { seedPlans } from "../features/plans/plans.seed";

/** The demo scenario: Saltmarsh Applied Language Lab, a fictional lab stretching its own fictional model families. */
export const DEMO_PASSWORD = "ropewalk-demo";
export const DEMO_LAB = "Saltmarsh Applied Language Lab";
export const DEMO_USERS: { email: string; name: string; roles: Role[] }[] = [
  { email: "admin@ropewalk.test", name: "Odile Varga", roles: ["admin"] },
  { email: "researcher@ropewalk.test", name: "Tomasz Brandt", roles: ["researcher"] },
  { email: "infra@ropewalk.test", name: "Priya Lindqvist", roles: ["infra"] },
  { email: "approver@ropewalk.test", name: "Henrik Osei", roles: ["approver"] },
  { email: "approver2@ropewalk.test", name: "Mireille Tanaka", roles: ["approver"] },
  { email: "viewer@ropewalk.test", name: "Jonah Pell", roles: ["viewer"] },
];

export type SeedStep = (deps: AppDeps, people: Map<string, number>) => Promise<void>;
/** Each feature's demo data, in order; every step must be idempotent. */
export const SEED_STEPS: SeedStep[] = [
  (deps, people) => seedModelProfiles(deps.db, people),
  (deps, people) => seedAccelerators(deps.db, people),
  seedPlans,
];

async function seedUsers(db: Db, bcryptCost: number) {
  const people = new Map<string, number>();
  for (const u of DEMO_USERS) {
    const existing = await db.execute<{ id: number }>(sql`SELECT id FROM users WHERE email = ${u.email}`);
    if (existing.rows[0]) {
      people.set(u.email, existing.rows[0].id);
      continue;
    }
    const passwordHash = await bcrypt.hash(DEMO_PASSWORD, bcryptCost);
    const [row] = await db
      .insert(users)
      .values({ ...u, passwordHash })
      .onConflictDoNothing()
      .returning();
    if (row) {
      people.set(u.email, row.id);
      await recordAudit(db, {
        actorId: null,
        action: "user.created",
        subjectType: "user",
        subjectId: row.id,
        detail: { email: u.email, roles: u.roles, by: "demo seed" },
      });
    }
  }
  return people;
}

export async function seedDemo(deps: AppDeps) {
  const people = await seedUsers(deps.db, deps.config.bcryptCost);
  for (const step of SEED_STEPS) await step(deps, people);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const { loadConfig } = await import("../config");
  const { createDb } = await import("./client");
  const config = loadConfig();
  const { pool, db } = createDb(config.databaseUrl, 2);
  await seedDemo({ config, pool, db });
  await pool.end();
  console.log("demo data seeded");
}
