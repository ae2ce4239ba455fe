// Runs every test_*.mjs in this folder; exits non-zero on any failure.
import { readdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv[2];
const named = process.argv[3];  // a part of the test's name, to run one test
let failed = 0, passed = 0;
for (const file of readdirSync(here).filter((f) => /^test_.*\.mjs$/.test(f)).sort()) {
  if (only && !file.includes(only)) continue;
  const { tests } = await import(`./${file}`);
  for (const [name, fn] of Object.entries(tests)) {
    if (named && !name.includes(named)) continue;
    const t0 = Date.now();
    let timer;
    try {
      // A test that stops making progress fails after its time limit instead of stalling the
      // whole suite (one run once hung for minutes waiting on a page that never answered).
      const limit = Number(process.env.TP_TEST_LIMIT_S || 300) * 1000;
      await Promise.race([fn(), new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error(`no result after ${limit / 1000} s (time limit per test)`)), limit);
      })]);
      clearTimeout(timer);
      passed++;
      console.log(`ok   ${file} › ${name} (${Date.now() - t0} ms)`);
    } catch (e) {
      clearTimeout(timer);
      failed++;
      console.log(`FAIL ${file} › ${name}\n     ${String(e.stack || e).split('\n').join('\n     ')}`);
    }
  }
}
console.log(`browser tests: ${passed} passed, ${failed} failed`);
process.exit(failed ? 1 : 0);
