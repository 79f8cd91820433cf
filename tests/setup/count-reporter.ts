import type { Reporter, TestModule } from "vitest/node";

/**
 * Prints the plain closing line CI reads: `N passed, N failed[, N skipped]`, after a line naming each test that passed
 * only on a second try.
 */
export default class CountReporter implements Reporter {
  onTestRunEnd(modules: ReadonlyArray<TestModule>, errors: ReadonlyArray<unknown>, reason?: string) {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    const secondTries: string[] = [];
    for (const m of modules) {
      for (const t of m.children.allTests()) {
        const state = t.result().state;
        if (state === "passed" && t.diagnostic()?.flaky)
          secondTries.push(`${m.moduleId.split("/tests/")[1] ?? m.moduleId} > ${t.fullName}`);
        if (state === "passed") passed++;
        else if (state === "failed") failed++;
        else skipped++;
      }
      // A file that failed to load counts as a failure, so a broken suite is never green.
      if (m.state() === "failed" && [...m.children.allTests()].length === 0) failed++;
    }
    failed += errors.length;
    // A run that failed before any test (setup, database) must not read as green.
    if (reason === "failed" && failed === 0) failed = 1;
    // Tests that passed only when retried (browser tests on CI) are named, so a race is seen and mended.
    for (const name of secondTries) process.stdout.write(`\npassed on a second try: ${name}`);
    const tail = skipped ? `, ${skipped} skipped` : "";
    process.stdout.write(`\n${passed} passed, ${failed} failed${tail}\n`);
  }
}
