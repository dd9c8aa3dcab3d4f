// `multiplet lab install --prefix DIR` lays out the prebuilt extension and the kernelspec the way JupyterLab 4
// reads them; checked with jupyterlab_server's own reader of federated extensions (Debian python3-jupyterlab-server).
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { test } from 'node:test';
import { repoRoot } from './server.mjs';

test('multiplet lab install --prefix: a federated extension jupyterlab_server finds, and the kernelspec', () => {
  const prefix = mkdtempSync(join(tmpdir(), 'multiplet-install-'));
  try {
    const printed = execFileSync(process.execPath, [join(repoRoot, 'packages/cli/bin/multiplet.mjs'), 'lab', 'install', '--prefix', prefix], { encoding: 'utf8' });
    const data = join(prefix, 'share/jupyter');
    assert.match(printed, new RegExp(`prebuilt extension in ${data}/labextensions/@multiplet/lab`));
    const found = execFileSync(
      '/usr/bin/python3',
      ['-c', 'import json, sys\nfrom jupyterlab_server.config import get_federated_extensions\nprint(json.dumps(get_federated_extensions([sys.argv[1]])))', join(data, 'labextensions')],
      { encoding: 'utf8' },
    );
    const extension = JSON.parse(found)['@multiplet/lab'];
    assert.ok(extension, `jupyterlab_server found: ${found}`);
    const build = extension.jupyterlab._build;
    assert.equal(build.extension, './extension');
    assert.equal(build.style, './style');
    assert.ok(existsSync(join(data, 'labextensions/@multiplet/lab', build.load)), `${build.load} exists`);
    const schemas = join(data, 'labextensions/@multiplet/lab/schemas/@multiplet/lab');
    const shortcuts = JSON.parse(readFileSync(join(schemas, 'state-panel.json'), 'utf8'))['jupyter.lab.shortcuts'];
    assert.ok(shortcuts.some((s) => s.command === 'multiplet:rerun-stale'));
    const kernel = JSON.parse(readFileSync(join(data, 'kernels/multiplet/kernel.json'), 'utf8'));
    assert.deepEqual(kernel.argv.slice(2), ['kernel', 'start', '--connection-file', '{connection_file}']);
    assert.ok(existsSync(kernel.argv[1]), `the kernel runs ${kernel.argv[1]}`);
  } finally {
    rmSync(prefix, { recursive: true, force: true });
  }
});
