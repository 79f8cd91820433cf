import { describe, expect, it } from "vitest";
import bcrypt from "bcryptjs";
import { loadConfig } from "../../server/config";

const production = {
  NODE_ENV: "production",
  SESSION_SECRET: "x".repeat(32),
  DATABASE_URL: "postgres://app@db.test/ropewalk",
};

describe("bcrypt cost", () => {
  it("is 12 outside tests (common practice for interactive sign-in, no source)", () => {
    expect(loadConfig(production).bcryptCost).toBe(12);
    expect(loadConfig({ NODE_ENV: "development" }).bcryptCost).toBe(12);
  });

  it("drops to bcrypt's least cost, 4, under NODE_ENV=test, and such a hash still verifies", async () => {
    const cost = loadConfig({ NODE_ENV: "test" }).bcryptCost;
    expect(cost).toBe(4);
    const hash = await bcrypt.hash("a-password", cost);
    // modular-crypt form $2b$04$… (Provos & Mazières 1999): the cost sits in the hash, so compare() pays it
    expect(hash).toMatch(/^\$2[aby]\$04\$/);
    expect(await bcrypt.compare("a-password", hash)).toBe(true);
    expect(await bcrypt.compare("another", hash)).toBe(false);
  });
});
