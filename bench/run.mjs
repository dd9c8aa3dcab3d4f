// `npm run bench`: bundles each bench/*.bench.ts (or only those whose name contains argv[2]) with esbuild and runs
// it in a fresh Node process, one after the other so that timings do not compete for the two cores.
import * as esbuild from 'esbuild';
import { readdirSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { root, nodeBundleOptions } from '../scripts/esbuild-workspace.mjs';

const filter = process.argv[2] ?? '';
const benchDir = join(root, 'bench');
const outdir = join(benchDir, 'build');
mkdirSync(outdir, { recursive: true });
const benches = readdirSync(benchDir).filter((f) => f.endsWith('.bench.ts') && f.includes(filter)).sort();
let failures = 0;
for (const file of benches) {
  const out = join(outdir, file.replace(/\.ts$/, '.mjs'));
  await esbuild.build({ ...nodeBundleOptions, entryPoints: [join(benchDir, file)], outfile: out });
  console.log(`\n### ${file}`);
  const r = spawnSync(process.execPath, [out], { stdio: 'inherit', cwd: root });
  if (r.status !== 0) failures++;
}
if (benches.length === 0) console.log(`no benchmarks match "${filter}"`);
process.exit(failures ? 1 : 0);
