import type { Reporter, TestModule } from 'vitest/node';

/**
 * Prints one closing line `tests: N passed, N failed, N skipped` so that any CI can tell tests ran.
 * vitest's own summary is in another form.
 */
export default class CountReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>, unhandledErrors: ReadonlyArray<unknown>): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const module of testModules) {
      for (const test of module.children.allTests()) {
        const state = test.result().state;
        if (state === 'passed') passed++;
        else if (state === 'failed') failed++;
        else skipped++;
      }
      // A file that failed to load has no tests but is still a failure.
      if (module.state() === 'failed' && [...module.children.allTests()].length === 0) failed++;
    }
    failed += unhandledErrors.length;
    process.stdout.write(`\ntests: ${passed} passed, ${failed} failed, ${skipped} skipped\n`);
  }
}
