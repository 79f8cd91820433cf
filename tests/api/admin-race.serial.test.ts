import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";

// Serial: the race only means something when these two are the lab's last active admins, so every other
// active admin is set inactive for the duration and restored afterwards.
const { agentAs, signIn } = makeTestApp();
const TRIES = 20;
let parked: number[] = [];

const activeAdmins = async () =>
  (await testDb().pool.query("SELECT id FROM users WHERE active AND 'admin' = ANY(roles) ORDER BY id")).rows.map(
    (r) => r.id as number,
  );
async function parkActiveAdmins() {
  const r = await testDb().pool.query(
    "UPDATE users SET active = false WHERE active AND 'admin' = ANY(roles) RETURNING id",
  );
  return r.rows.map((row) => row.id as number);
}

beforeAll(async () => {
  parked = await parkActiveAdmins();
});
afterAll(async () => {
  await testDb().pool.query("UPDATE users SET active = true WHERE id = ANY($1::int[])", [parked]);
});

describe("the last two admins removing each other at once", () => {
  it.each([
    ["demote", { roles: ["viewer"] }],
    ["deactivate", { active: false }],
  ])(
    "%s: exactly one change succeeds, the other is refused, never zero admins and never a 500",
    async (_name, change) => {
      let zeroAdmins = 0;
      const statuses: number[] = [];
      const wrong: string[] = [];
      // Two admins signed in once; each try makes them the only active admins again (sign-in is the slow part).
      let [a, b] = await Promise.all([agentAs(["admin"]), agentAs(["admin"])]);
      for (let i = 0; i < TRIES; i++) {
        parked.push(...(await parkActiveAdmins()));
        await testDb().pool.query("UPDATE users SET active = true, roles = '{admin}' WHERE id = ANY($1::int[])", [
          [a.user!.id, b.user!.id],
        ]);
        // deactivation ends the sessions of the deactivated one
        [a, b] = await Promise.all(
          [a, b].map(async (x) =>
            (await x.get("/api/auth/session")).body.user
              ? x
              : signIn(x.user!).then((y) => Object.assign(y, { user: x.user })),
          ),
        );
        const [ra, rb] = await Promise.all([
          a.patch(`/api/users/${b.user!.id}`).set("X-CSRF-Token", a.csrf).send(change),
          b.patch(`/api/users/${a.user!.id}`).set("X-CSRF-Token", b.csrf).send(change),
        ]);
        statuses.push(ra.status, rb.status);
        const left = await activeAdmins();
        if (left.length === 0) zeroAdmins++;
        else if (left.length !== 1) wrong.push(`try ${i}: ${left.length} admins left`);
        const winners = [ra, rb].filter((r) => r.status === 200).length;
        if (winners !== 1) wrong.push(`try ${i}: ${winners} changes succeeded (${ra.status}, ${rb.status})`);
        // 409 when both requests reached the admin check; 401/403 when the winner had already committed
        // before the loser's own sign-in or role check ran. Either way a refusal, never a 500.
        const loser = ra.status === 200 ? rb : ra;
        if (![401, 403, 409].includes(loser.status))
          wrong.push(`try ${i}: loser answered ${loser.status} ${JSON.stringify(loser.body)}`);
      }
      console.log(
        `[admin race] ${JSON.stringify(change)}: ${zeroAdmins} of ${TRIES} tries left zero admins; statuses ${JSON.stringify(countBy(statuses))}`,
      );
      expect(zeroAdmins).toBe(0);
      expect(wrong).toEqual([]);
    },
    120_000,
  );
});

function countBy(xs: number[]) {
  const out: Record<number, number> = {};
  for (const x of xs) out[x] = (out[x] ?? 0) + 1;
  return out;
}
