#!/usr/bin/env node
// Thin launcher: the CLI is bundled by `npm run build` (run automatically by `npm ci` / `npm install`).
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const bundle = fileURLToPath(new URL('../dist/multiplet.js', import.meta.url));
if (!existsSync(bundle)) {
  process.stderr.write('multiplet: the CLI is not built yet; run `npm run build` at the repository root\n');
  process.exit(2);
}
await import(bundle);
