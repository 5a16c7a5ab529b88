'use strict';
// Mocha's spec reporter plus the plain closing line `N passed, N failed`
// that CI reads. Pending (skipped) tests are counted and shown, never hidden.
const Mocha = require('mocha');
const { EVENT_RUN_END } = Mocha.Runner.constants;

class PassFailReporter extends Mocha.reporters.Spec {
  constructor(runner, options) {
    super(runner, options);
    runner.once(EVENT_RUN_END, () => {
      const s = runner.stats;
      const skipped = s.pending ? `, ${s.pending} skipped` : '';
      // Printed after the spec summary so it is the last line of the run.
      process.nextTick(() => console.log(`${s.passes} passed, ${s.failures} failed${skipped}`));
    });
  }
}
module.exports = PassFailReporter;
