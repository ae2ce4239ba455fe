// Runs every test_*.mjs in this folder; exits non-zero on any failure.
import { readdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv[2];
let failed = 0, passed = 0;
for (const file of readdirSync(here).filter((f) => /^test_.*\.mjs$/.test(f)).sort()) {
  if (only && !file.includes(only)) continue;
  const { tests } = await import(`./${file}`);
  for (const [name, fn] of Object.entries(tests)) {
    const t0 = Date.now();
    try {
      await fn();
      passed++;
      console.log(`ok   ${file} › ${name} (${Date.now() - t0} ms)`);
    } catch (e) {
      failed++;
      console.log(`FAIL ${file} › ${name}\n     ${String(e.stack || e).split('\n').join('\n     ')}`);
    }
  }
}
console.log(`browser tests: ${passed} passed, ${failed} failed`);
process.exit(failed ? 1 : 0);
