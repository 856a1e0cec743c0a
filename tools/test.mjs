#!/usr/bin/env node
// `npm test`: every suite against a throwaway database, then one closing line `N passed, N failed`.
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { ensureChromium, ensureDependencies, ng, projectRoot, projectTmpDir, run, say } from './lib/process.mjs';

const resultsDir = join(projectRoot, '.tmp', 'results');

/** Counts from a Vitest JSON report; a suite that produced no report counts one failure. */
function vitestCounts(file) {
  if (!existsSync(file)) return { passed: 0, failed: 1, note: 'no report written' };
  const report = JSON.parse(readFileSync(file, 'utf8'));
  const brokenFiles = (report.testResults ?? []).filter((r) => r.status === 'failed' && (r.assertionResults ?? []).length === 0).length;
  return { passed: report.numPassedTests, failed: report.numFailedTests + brokenFiles + (report.success || report.numFailedTests || brokenFiles ? 0 : 1) };
}

function karmaCounts(file) {
  if (!existsSync(file)) return { passed: 0, failed: 1, note: 'no report written' };
  const counts = JSON.parse(readFileSync(file, 'utf8'));
  return { passed: counts.passed, failed: counts.failed };
}

function vitest(projects, reportName, env) {
  const report = join(resultsDir, reportName);
  rmSync(report, { force: true });
  const args = [join(projectRoot, 'node_modules', 'vitest', 'vitest.mjs'), 'run', ...projects.flatMap((p) => ['--project', p])];
  args.push('--reporter=default', '--reporter=json', `--outputFile.json=${report}`);
  const status = run(process.execPath, args, { env });
  const counts = vitestCounts(report);
  if (status !== 0 && counts.failed === 0) counts.failed = 1;
  return counts;
}

async function main() {
  process.env.TMPDIR ??= projectTmpDir();
  rmSync(resultsDir, { recursive: true, force: true });
  ensureDependencies();
  ensureChromium();
  process.env.CHROME_BIN ??= '/usr/bin/chromium';

  const { startTestDatabase, stopTestDatabase } = await import('../test/support/test-database.mjs');
  const suites = [];
  let exitCode = 0;
  try {
    const env = { ...process.env, TEST_DATABASE_URL: startTestDatabase(), LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn' };

    // Built first: the API suites check the served index.html, the end-to-end suite drives it.
    say('test', 'building the web app');
    const built = ng(['build'], env) === 0;
    if (!built) suites.push(['build', { passed: 0, failed: 1 }]);

    say('test', 'engine and API suites (Vitest)');
    suites.push(['vitest: shared + api', vitest(['shared', 'api'], 'vitest.json', env)]);

    say('test', 'component specs (Karma in Chromium)');
    const karmaFile = join(projectRoot, '.tmp', 'karma-result.json');
    rmSync(karmaFile, { force: true });
    const karmaStatus = ng(['test', '--watch=false'], env);
    const karma = karmaCounts(karmaFile);
    if (karmaStatus !== 0 && karma.failed === 0) karma.failed = 1;
    suites.push(['karma', karma]);

    if (built) {
      say('test', 'end-to-end suite (Playwright in Chromium)');
      suites.push(['vitest: e2e', vitest(['e2e'], 'e2e.json', env)]);
    }
  } catch (error) {
    process.stderr.write(`[test] ${error instanceof Error ? error.stack : String(error)}\n`);
    suites.push(['runner', { passed: 0, failed: 1 }]);
  } finally {
    try {
      stopTestDatabase();
    } catch (error) {
      process.stderr.write(`[test] could not stop the test database: ${error instanceof Error ? error.message : String(error)}\n`);
    }
  }

  let passed = 0;
  let failed = 0;
  process.stdout.write('\n');
  for (const [name, counts] of suites) {
    passed += counts.passed;
    failed += counts.failed;
    process.stdout.write(`  ${name.padEnd(22)} ${counts.passed} passed, ${counts.failed} failed${counts.note ? ` (${counts.note})` : ''}\n`);
  }
  if (failed > 0) exitCode = 1;
  process.stdout.write(`${passed} passed, ${failed} failed\n`);
  process.exit(exitCode);
}

main();
