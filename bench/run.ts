/**
 * `npm run bench`: runs every suite in bench/suites/ (or only those named on the command line,
 * e.g. `npm run bench -- kalman c3d`) and prints each suite's table. Suites print ratios against a
 * peer measured in the same run; no figure here is a pass/fail test.
 */
import { readdirSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { join } from 'node:path';

export interface BenchSuite {
  name: string;
  /** Runs the suite and prints its own table to stdout. */
  run(): Promise<void>;
}

const dir = fileURLToPath(new URL('./suites', import.meta.url));
const only = process.argv.slice(2);
const files = readdirSync(dir).filter((f) => f.endsWith('.ts')).sort();
console.log(`Forecatch benchmarks on ${process.platform} ${process.arch}, Node ${process.version}`);
for (const file of files) {
  const mod = (await import(pathToFileURL(join(dir, file)).href)) as { suite?: BenchSuite };
  if (!mod.suite) continue;
  if (only.length > 0 && !only.some((o) => mod.suite!.name.includes(o) || file.includes(o))) continue;
  console.log(`\n## ${mod.suite.name}`);
  const t0 = performance.now();
  await mod.suite.run();
  console.log(`(${mod.suite.name}: ${((performance.now() - t0) / 1000).toFixed(1)} s)`);
}
