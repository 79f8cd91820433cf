// Exponential backoff with a cap: common practice, no source. Values worked by hand below.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { MAX_RETRY_DELAY_MS, retryDelayMs } from "../../../server/mailer/retry";

describe("retryDelayMs", () => {
  it("doubles from the base and stops at ten minutes", () => {
    expect(retryDelayMs(5000, 0)).toBe(5000);
    expect(retryDelayMs(5000, 1)).toBe(10_000);
    expect(retryDelayMs(5000, 6)).toBe(320_000); // 5 s · 64
    expect(retryDelayMs(5000, 7)).toBe(600_000); // 5 s · 128 = 640 s, over the 600 s cap
    expect(retryDelayMs(5000, 19)).toBe(600_000);
    expect(retryDelayMs(0, 5)).toBe(0); // tests retry at once
  });

  it("each wait is twice the previous until the cap, and never more than the cap", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100_000 }), fc.integer({ min: 0, max: 30 }), (base, a) => {
        const now = retryDelayMs(base, a);
        const next = retryDelayMs(base, a + 1);
        expect(next).toBe(Math.min(2 * now, MAX_RETRY_DELAY_MS));
        expect(next).toBeLessThanOrEqual(MAX_RETRY_DELAY_MS);
      }),
    );
  });
});
