import { describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createPlan, createProfile } from "../../setup/plans";
import { TOTAL_CAP } from "../../../server/platform/paging";

const { agentAs } = makeTestApp();
const { db } = testDb();

const eventsBy = async (actorId: number) =>
  (await db.execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM audit_events WHERE actor_id = ${actorId}`))
    .rows[0]!.n;

type AuditBody = { page: number; events: { id: number }[]; nextBefore: number | null; prevBefore: number | null };
const ids = (b: AuditBody) => b.events.map((e) => e.id);

describe("audit trail pages by number", () => {
  it("answers page= only as deep as the capped total names it; deeper pages go by before=, and the 400 writes nothing", async () => {
    const admin = await agentAs(["admin"]);
    const researcher = await agentAs(["researcher"]);
    await createProfile(researcher);
    const url = `/api/audit?actorId=${researcher.user!.id}`;
    // The deepest numbered page holds the TOTAL_CAP-th event (10 000): ceil(10 000 / pageSize), the one page with
    // (page − 1) × size < cap ≤ page × size. The default size (50) stops at 200; the largest (200) at 50.
    for (const [pageSize, deepest] of [
      [50, 200],
      [3, 3334],
      [200, 50],
    ]) {
      expect((deepest! - 1) * pageSize! < TOTAL_CAP && TOTAL_CAP <= deepest! * pageSize!).toBe(true);
      const ok = await admin.get(`${url}&pageSize=${pageSize}&page=${deepest}`).expect(200);
      expect(ok.body).toMatchObject({ events: [], page: deepest });
      const written = await eventsBy(admin.user!.id);
      const deeper = await admin.get(`${url}&pageSize=${pageSize}&page=${deepest! + 1}`);
      expect(deeper.status).toBe(400);
      expect(deeper.body.error.fields.page).toBeTruthy();
      expect(deeper.body.error.message).toContain(`${deepest}`);
      expect(deeper.body.error.message).toContain("before=");
      expect(await eventsBy(admin.user!.id)).toBe(written);
    }
    // Without pageSize the default (50) applies to the bound too.
    expect((await admin.get(`${url}&page=201`)).status).toBe(400);
    // With a cursor the number only labels the page, so a deep label is fine (the Audit screen reads on this way).
    const first = (await admin.get(`${url}&pageSize=1`).expect(200)).body as AuditBody;
    expect(first.nextBefore).toEqual(expect.any(Number));
    const deep = await admin.get(`${url}&pageSize=1&page=20001&before=${first.nextBefore}`).expect(200);
    expect(deep.body.page).toBe(20001);
  });

  it("walks back from any page by prevBefore, each page the same events as going forward", async () => {
    const admin = await agentAs(["admin"]);
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    for (let i = 0; i < 3; i++) await createPlan(researcher, model.id);
    const url = `/api/audit?actorId=${researcher.user!.id}`;
    const whole = ids((await admin.get(`${url}&pageSize=200`).expect(200)).body as AuditBody);
    expect(whole.length).toBeGreaterThanOrEqual(4);
    for (const pageSize of [1, 2, 3]) {
      // Forward by nextBefore, remembering each page.
      const pages: AuditBody[] = [];
      let before: number | null = null;
      for (let page = 1; ; page++) {
        const cursor: string = before ? `&before=${before}` : "";
        const body = (await admin.get(`${url}&pageSize=${pageSize}&page=${page}${cursor}`).expect(200))
          .body as AuditBody;
        if (body.events.length === 0) break;
        expect(ids(body), `size ${pageSize} page ${page}`).toEqual(whole.slice((page - 1) * pageSize, page * pageSize));
        // The first page has nothing before it; the second goes back to it without a cursor.
        if (page <= 2) expect(body.prevBefore).toBeNull();
        pages.push(body);
        before = body.nextBefore;
        if (!before) break;
      }
      // Back from the last page by prevBefore: each is the page read forward, to the second (page 1 needs none).
      for (let page = pages.length; page > 2; page--) {
        const prev = pages[page - 1]!.prevBefore;
        expect(prev, `size ${pageSize} back from ${page}`).toEqual(expect.any(Number));
        const body = (await admin.get(`${url}&pageSize=${pageSize}&page=${page - 1}&before=${prev}`).expect(200))
          .body as AuditBody;
        expect(ids(body)).toEqual(ids(pages[page - 2]!));
        expect(body.prevBefore).toEqual(pages[page - 2]!.prevBefore);
      }
    }
  });
});
