// Product wording checks (our own copy, no outside source): every message carries the link and the
// hash, subjects stay one bounded line, comments are quoted, and "ready" states what the export is.
import { describe, expect, it } from "vitest";
import {
  approvedMail,
  changesRequestedMail,
  planReadyMail,
  reviewRequestedMail,
  withdrawnMail,
  type PlanMailInput,
} from "../../../server/mailer/messages";

const input: PlanMailInput = {
  planId: 12,
  planTitle: "Extend the 7B base to 128k",
  revision: 4,
  actorName: "Tomasz Ferreira",
  contentHash: "0f".repeat(32),
  url: "http://127.0.0.1:3000/plans/12",
  round: 1,
};
const BUILDERS = { reviewRequestedMail, withdrawnMail, changesRequestedMail, approvedMail, planReadyMail };

describe("plan workflow mail", () => {
  it("gives five distinct kinds and subjects naming the plan and revision", () => {
    const mails = Object.values(BUILDERS).map((b) => b(input));
    expect(new Set(mails.map((m) => m.kind)).size).toBe(5);
    expect(new Set(mails.map((m) => m.subject)).size).toBe(5);
    for (const m of mails) expect(m.subject).toContain(`"${input.planTitle}" rev. 4`);
  });

  for (const [name, build] of Object.entries(BUILDERS)) {
    it(`${name}: link, hash and actor in the body; a comment is quoted line by line`, () => {
      const plain = build(input);
      expect(plain.body).toContain(`Open the plan: ${input.url}`);
      expect(plain.body).toContain(input.contentHash);
      expect(plain.body).toContain(input.actorName);
      expect(plain.body).not.toContain("Comment from");
      const commented = build({ ...input, comment: "Bound looks tight.\nRe-run at 96k." });
      expect(commented.body).toContain("Comment from Tomasz Ferreira:\n  > Bound looks tight.\n  > Re-run at 96k.");
    });
  }

  // Defect (issue 15): a resubmission's mail had the same subject as the first submission.
  it("numbers the inspection round, so a resubmission's subject differs from the first and says it is a later round", () => {
    const first = reviewRequestedMail(input);
    const again = reviewRequestedMail({ ...input, round: 2 });
    expect(first.subject).toBe(`For inspection: "${input.planTitle}" rev. 4, round 1`);
    expect(again.subject).toBe(`For inspection: "${input.planTitle}" rev. 4, round 2`);
    expect(again.body).toContain("This is round 2 of this revision");
    expect(first.body).not.toContain("This is round");
    expect(withdrawnMail({ ...input, round: 2 }).subject).toBe(
      `Taken back from inspection: "${input.planTitle}" rev. 4, round 2`,
    );
  });

  it("keeps the subject on one bounded line whatever the title", () => {
    const m = reviewRequestedMail({ ...input, planTitle: `Two\nlines ${"x".repeat(300)}` });
    expect(m.subject).not.toMatch(/[\r\n]/);
    expect(m.subject.length).toBeLessThan(160);
    expect(m.subject).toContain("Two lines");
  });

  it("says the export is the signed configuration patch, confirmed only by long-context evaluations", () => {
    const body = planReadyMail(input).body.replace(/\s+/g, " ");
    expect(body).toContain("The export is the signed configuration patch");
    expect(body).toContain("confirmed only by long-context evaluations of the tuned model");
  });
});
