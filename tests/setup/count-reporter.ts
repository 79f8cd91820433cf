import type { Reporter, TestModule } from "vitest/node";

/** Prints the plain closing line CI reads: `N passed, N failed[, N skipped]`. */
export default class CountReporter implements Reporter {
  onTestRunEnd(modules: ReadonlyArray<TestModule>, errors: ReadonlyArray<unknown>, reason?: string) {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const m of modules) {
      for (const t of m.children.allTests()) {
        const state = t.result().state;
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
    const tail = skipped ? `, ${skipped} skipped` : "";
    process.stdout.write(`\n${passed} passed, ${failed} failed${tail}\n`);
  }
}
