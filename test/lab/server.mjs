// Starts the standalone page exactly as a user does: `multiplet lab NOTEBOOKS --no-build --token T` (the CLI
// bundle, Debian's jupyter_server, the Multiplet kernelspec on a private JUPYTER_PATH), and stops it by PID.
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const repoRoot = resolve(dirname(fileURLToPath(import.meta.url)), '../..');

export async function startLab(notebooks) {
  const token = randomBytes(16).toString('hex');
  const child = spawn(process.execPath, [join(repoRoot, 'packages/cli/bin/multiplet.mjs'), 'lab', ...notebooks, '--no-build', '--token', token], {
    cwd: repoRoot,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stderr.on('data', (chunk) => (output += chunk));
  const pages = await new Promise((resolvePages, reject) => {
    const found = {};
    const timer = setTimeout(() => reject(new Error(`multiplet lab did not start in 90 s:\n${output}`)), 90_000);
    child.stdout.on('data', (chunk) => {
      output += chunk;
      for (const match of String(chunk).matchAll(/^multiplet lab: (http:\S+path=([^&\s]+)\S*)$/gm)) found[decodeURIComponent(match[2])] = match[1];
      if (/Ctrl\+C stops the server/.test(output)) {
        clearTimeout(timer);
        resolvePages(found);
      }
    });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`multiplet lab exited with code ${code}:\n${output}`));
    });
  });
  return {
    token,
    pages,
    output: () => output,
    async stop() {
      if (child.exitCode !== null) return;
      const exited = new Promise((r) => child.once('exit', r));
      process.kill(child.pid, 'SIGTERM');
      await exited;
    },
  };
}
