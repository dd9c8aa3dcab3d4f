// Connection files, kernelspec paths and CLI flags: the parts of the kernel that face the user's machine.
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildKernelSpec, ConnectionFileError, endpoint, installKernelSpec, KernelNameError, kernelSpecDir, parseConnectionInfo, userDataDir } from '@multiplet/kernel-bridge';
import { globToRegExp } from '@multiplet/kernel-bridge/history';
import { parseInstallArgs } from '@multiplet/cli/kernel/install';
import { parseStartArgs } from '@multiplet/cli/kernel/start';

const ports = { shell_port: 5001, iopub_port: 5002, stdin_port: 5003, control_port: 5004, hb_port: 5005 };

describe('connection files', () => {
  it('reads what jupyter_client writes, with defaults for the optional fields', () => {
    const info = parseConnectionInfo({ ...ports, ip: '127.0.0.1', key: 'abc', transport: 'tcp', signature_scheme: 'hmac-sha256', kernel_name: 'multiplet' });
    expect(info).toMatchObject({ ...ports, key: 'abc', transport: 'tcp' });
    expect(endpoint(info, 5001)).toBe('tcp://127.0.0.1:5001');
    expect(endpoint({ ...info, ip: '::1' }, 5001)).toBe('tcp://[::1]:5001');
    expect(endpoint({ ...info, transport: 'ipc', ip: '/tmp/k' }, 5001)).toBe('ipc:///tmp/k-5001');
    expect(parseConnectionInfo({ ...ports })).toMatchObject({ ip: '127.0.0.1', key: '', signature_scheme: 'hmac-sha256' });
  });

  it('names the field that is wrong', () => {
    expect(() => parseConnectionInfo([])).toThrow(ConnectionFileError);
    expect(() => parseConnectionInfo({ ...ports, hb_port: 'x' })).toThrow(/hb_port/);
    expect(() => parseConnectionInfo({ ...ports, shell_port: 70000 })).toThrow(/shell_port/);
    expect(() => parseConnectionInfo({ ...ports, transport: 'udp' })).toThrow(/transport/);
    expect(() => parseConnectionInfo({ ...ports, key: 5 })).toThrow(/key/);
  });
});

describe('kernelspec', () => {
  it('points at node and the bundled CLI with the connection file placeholder', () => {
    const spec = buildKernelSpec('/usr/bin/node', '/repo/packages/cli/dist/multiplet.js', '0.1.0');
    expect(spec.argv).toEqual(['/usr/bin/node', '/repo/packages/cli/dist/multiplet.js', 'kernel', 'start', '--connection-file', '{connection_file}']);
    expect(spec).toMatchObject({ display_name: 'Multiplet', language: 'multiplet-cells', interrupt_mode: 'message' });
  });

  it('follows jupyter_core path rules for user and prefix installs', () => {
    expect(userDataDir({ HOME: '/home/u' })).toBe('/home/u/.local/share/jupyter');
    expect(userDataDir({ HOME: '/home/u', XDG_DATA_HOME: '/xdg' })).toBe('/xdg/jupyter');
    expect(userDataDir({ HOME: '/home/u', JUPYTER_DATA_DIR: '/jd' })).toBe('/jd');
    expect(kernelSpecDir({ kind: 'prefix', prefix: '/opt/j' }, 'multiplet')).toBe('/opt/j/share/jupyter/kernels/multiplet');
  });

  it('writes kernel.json and refuses names jupyter_client would not accept', () => {
    const dir = mkdtempSync(join(tmpdir(), 'multiplet-spec-'));
    try {
      const spec = buildKernelSpec('/usr/bin/node', '/x/multiplet.js', '0.1.0');
      const at = installKernelSpec(spec, { kind: 'prefix', prefix: dir }, 'multiplet-a.b_c');
      expect(JSON.parse(readFileSync(join(at, 'kernel.json'), 'utf8'))).toEqual(spec);
      expect(() => installKernelSpec(spec, { kind: 'prefix', prefix: dir }, '../escape')).toThrow(KernelNameError);
      expect(() => installKernelSpec(spec, { kind: 'prefix', prefix: dir }, '')).toThrow(KernelNameError);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('CLI flags', () => {
  it('parses install targets and names', () => {
    expect(parseInstallArgs([])).toEqual({ target: { kind: 'user' }, name: 'multiplet' });
    expect(parseInstallArgs(['--prefix', '/p', '--name', 'm2'])).toEqual({ target: { kind: 'prefix', prefix: '/p' }, name: 'm2' });
    expect(parseInstallArgs(['--prefix=/p'])).toEqual({ target: { kind: 'prefix', prefix: '/p' }, name: 'multiplet' });
    expect(parseInstallArgs(['--user', '--prefix', '/p'])).toMatch(/exclude/);
    expect(parseInstallArgs(['--prefix'])).toMatch(/needs a directory/);
    expect(parseInstallArgs(['--sys'])).toMatch(/unknown option/);
  });

  it('parses the start flags', () => {
    expect(parseStartArgs(['--connection-file', 'k.json'])).toEqual({ connectionFile: 'k.json' });
    expect(parseStartArgs(['-f', 'k.json'])).toEqual({ connectionFile: 'k.json' });
    expect(parseStartArgs(['--connection-file=k.json'])).toEqual({ connectionFile: 'k.json' });
    expect(parseStartArgs([])).toMatch(/missing/);
  });
});

describe('history search globs', () => {
  it('matches like a shell glob, anchored', () => {
    expect(globToRegExp('1 + ?').test('1 + 2')).toBe(true);
    expect(globToRegExp('1 + ?').test('1 + 23')).toBe(false);
    expect(globToRegExp('*sample*').test('[sample] s\nion: Yb')).toBe(true);
    expect(globToRegExp('[ab]x').test('bx')).toBe(true);
    expect(globToRegExp('[!ab]x').test('bx')).toBe(false);
    expect(globToRegExp('a.b(c)').test('a.b(c)')).toBe(true);
    expect(globToRegExp('a.b').test('axb')).toBe(false);
    expect(globToRegExp('[').test('[')).toBe(true);
  });
});
