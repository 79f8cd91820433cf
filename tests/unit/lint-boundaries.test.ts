import { describe, expect, it } from "vitest";
import { ESLint } from "eslint";

/*
 * Runs the repository's real eslint.config.js over one-line files placed (virtually) in each layer,
 * so a config change that silently stops enforcing docs/import-walls.md fails here.
 * Each import target exists in the repo; the importing file does not need to.
 */
const CASES: [from: string, source: string, refused: boolean][] = [
  ["client/src/features/users/x.ts", "../auth/api/keys", true],
  ["client/src/features/users/components/x.ts", "../api/keys", false],
  ["client/src/features/users/x.ts", "../../app/nav", true],
  ["client/src/features/users/x.ts", "../../lib/format", false],
  ["client/src/components/x.tsx", "../features/auth/api/keys", true],
  ["client/src/components/x.tsx", "../app/nav", true],
  ["client/src/lib/x.ts", "../features/users/api/keys", true],
  ["client/src/lib/x.ts", "../config/paths", false],
  ["client/src/app/x.tsx", "../features/users/api/keys", false],
  ["server/engine/x.ts", "../db/client", true],
  ["server/engine/x.ts", "../features/users/users.service", true],
  ["server/engine/x.ts", "../../scripts/start", true],
  ["server/engine/x.ts", "node:fs", true],
  ["server/engine/x.ts", "node:crypto", false],
  ["server/engine/x.ts", "express", true],
  ["server/engine/x.ts", "zod", false],
  ["server/engine/x.ts", "../../shared/schemas/common", false],
  ["shared/schemas/x.ts", "../../server/platform/errors", true],
  ["shared/schemas/x.ts", "../../client/src/lib/format", true],
  ["shared/schemas/x.ts", "./common", false],
  ["server/features/users/x.ts", "../../../client/src/lib/format", true],
  ["server/features/users/x.ts", "../../platform/errors", false],
  // One probe per server wall (issue 9): client→server, feature→another feature's insides, http→feature,
  // platform→feature, router→repo, service→http; and the allowed faces.
  ["client/src/lib/x.ts", "../../../server/platform/errors", true],
  ["server/features/plans/x.ts", "../models/models.repo", true],
  ["server/features/plans/x.ts", "../models", false],
  ["server/features/plans/x.ts", "../models/index", false],
  ["server/features/models/index.ts", "./models.repo", false],
  ["server/features/models/index.ts", "../plans/plans.repo", true],
  ["server/http/x.ts", "../features/users", true],
  ["server/features/plans/x.ts", "./plans.repo", false],
  ["server/http/x.ts", "../features/users/users.repo", true],
  ["server/http/x.ts", "../platform/identity", false],
  ["server/platform/x.ts", "../features/users", true],
  ["server/platform/x.ts", "../http/auth", true],
  ["server/features/plans/x.router.ts", "./plans.repo", true],
  ["server/features/plans/x.router.ts", "./plans.service", false],
  ["server/features/plans/x.service.ts", "../../http/auth", true],
  // The `@/` (client/src) and `@shared/` aliases resolve through tsconfig.json, so they meet the same walls.
  ["client/src/features/users/x.ts", "@/features/auth/api/keys", true],
  ["client/src/features/users/x.ts", "@/lib/format", false],
  ["client/src/components/x.tsx", "@/app/nav", true],
  ["client/src/lib/x.ts", "@shared/schemas/common", false],
  ["server/features/users/x.ts", "@/lib/format", true],
];
const WALL_RULES = new Set(["boundaries/dependencies", "no-restricted-imports", "import-x/no-cycle"]);

describe("import boundaries (eslint-plugin-boundaries via eslint.config.js)", () => {
  const eslint = new ESLint();
  it.each(CASES)("%s importing %s: refused=%s", async (from, source, refused) => {
    const [result] = await eslint.lintText(`import * as m from "${source}";\nexport const x = m;\n`, {
      filePath: from,
    });
    const hits = result.messages.filter((m) => WALL_RULES.has(m.ruleId ?? ""));
    expect(hits.length > 0).toBe(refused);
  });
});

describe("import cycles (import-x/no-cycle via eslint.config.js)", () => {
  const eslint = new ESLint();
  // shared/methods/catalog.ts imports ./entry; an entry.ts that imported the catalog back would close a cycle.
  it.each([
    ["shared/methods/entry.ts", "./catalog", true],
    ["shared/methods/entry.ts", "./params", false],
  ])("%s importing %s: refused=%s", async (from, source, refused) => {
    const [result] = await eslint.lintText(`import * as m from "${source}";\nexport const x = m;\n`, {
      filePath: from,
    });
    expect(result.messages.some((m) => m.ruleId === "import-x/no-cycle")).toBe(refused);
  });
});
