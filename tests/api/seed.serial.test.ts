import { describe, expect, it } from "vitest";
import { seedDemo, DEMO_USERS } from "../../server/db/seed";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";

// Serial: the demo seed writes lab-wide rows (demo users, profiles, plans) into the shared test database.
const { deps, signIn } = makeTestApp();
const counts = async () => {
  const q = (t: string) =>
    testDb()
      .pool.query(`SELECT count(*)::int AS n FROM ${t}`)
      .then((r) => r.rows[0].n as number);
  return {
    users: await q("users"),
    models: await q("model_profiles"),
    plans: await q("plans"),
    revisions: await q("plan_revisions"),
    accelerators: await q("accelerators"),
  };
};

describe("demo seed", () => {
  it("seeds a whole scenario once, and a second run changes nothing", async () => {
    await seedDemo(deps);
    const first = await counts();
    await seedDemo(deps);
    expect(await counts()).toEqual(first);

    const states = await testDb().pool.query(
      "SELECT DISTINCT r.state FROM plan_revisions r JOIN plans p ON p.id = r.plan_id JOIN users u ON u.id = p.owner_id WHERE u.email = 'researcher@ropewalk.test'",
    );
    expect(states.rows.map((r) => r.state).sort()).toEqual([
      "approved",
      "changes_requested",
      "draft",
      "in_review",
      "superseded",
    ]);
    for (const u of DEMO_USERS)
      await expect(signIn({ email: u.email, password: "ropewalk-demo" })).resolves.toBeTruthy();
    const verify = await testDb().pool.query(
      "SELECT count(*)::int AS n FROM plan_revisions r JOIN plans p ON p.id = r.plan_id WHERE p.title LIKE 'Gannet-8B to 128k%' AND r.state = 'approved'",
    );
    expect(verify.rows[0].n).toBe(1);
  });
});
