// Karma for the Angular specs (run by `ng test`, which supplies the files and the build).
const fs = require('node:fs');
const path = require('node:path');

process.env.CHROME_BIN ||= '/usr/bin/chromium';

const resultFile = path.join(__dirname, '.tmp', 'karma-result.json');

/**
 * Writes the run's counts as `{"passed": N, "failed": N, "skipped": N}` for the project's test
 * runner, which sums every suite into one closing line. A run that broke before or between specs
 * (build error, browser lost) counts one extra failure so it can never read as green.
 */
function ResultFileReporter() {
  let counts = { passed: 0, failed: 0, skipped: 0 };

  this.onRunStart = () => {
    counts = { passed: 0, failed: 0, skipped: 0 };
    fs.rmSync(resultFile, { force: true });
  };

  this.onSpecComplete = (_browser, result) => {
    if (result.skipped || result.pending) counts.skipped += 1;
    else if (result.success) counts.passed += 1;
    else counts.failed += 1;
  };

  this.onRunComplete = (_browsers, results) => {
    const broken = results.error || results.disconnected ? 1 : 0;
    fs.mkdirSync(path.dirname(resultFile), { recursive: true });
    fs.writeFileSync(resultFile, JSON.stringify({ ...counts, failed: counts.failed + broken }) + '\n');
  };
}

module.exports = function (config) {
  config.set({
    basePath: '',
    frameworks: ['jasmine'],
    plugins: [
      require('karma-jasmine'),
      require('karma-chrome-launcher'),
      { 'reporter:result-file': ['type', ResultFileReporter] },
    ],
    client: {
      jasmine: { random: true },
    },
    reporters: ['progress', 'result-file'],
    browsers: ['ChromeHeadlessQuiet'],
    customLaunchers: {
      // Root needs --no-sandbox; the rest keeps Chromium from calling hosts on a closed network.
      ChromeHeadlessQuiet: {
        base: 'ChromeHeadless',
        flags: [
          '--no-sandbox',
          '--disable-gpu',
          '--disable-dev-shm-usage',
          '--disable-background-networking',
          '--disable-component-update',
          '--disable-sync',
          '--no-first-run',
        ],
      },
    },
    singleRun: true,
    restartOnFileChange: false,
  });
};
