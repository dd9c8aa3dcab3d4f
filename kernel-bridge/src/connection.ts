/**
 * The connection file a kernel manager writes (Jupyter client docs, "Connection files"): transport, ip, five
 * ports, the signing key and scheme.
 */
import { readFileSync } from 'node:fs';

export interface ConnectionInfo {
  transport: 'tcp' | 'ipc';
  ip: string;
  shell_port: number;
  iopub_port: number;
  stdin_port: number;
  control_port: number;
  hb_port: number;
  key: string;
  signature_scheme: string;
}

export class ConnectionFileError extends Error {
  constructor(readonly field: string, readonly given: unknown, readonly expected: string) {
    super(`connection file: ${field} is ${JSON.stringify(given)}, expected ${expected}`);
    this.name = 'ConnectionFileError';
  }
}

const PORTS = ['shell_port', 'iopub_port', 'stdin_port', 'control_port', 'hb_port'] as const;

/** Validate a parsed connection file. */
export function parseConnectionInfo(raw: unknown): ConnectionInfo {
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) throw new ConnectionFileError('(root)', raw, 'a JSON object');
  const r = raw as Record<string, unknown>;
  const transport = r.transport ?? 'tcp';
  if (transport !== 'tcp' && transport !== 'ipc') throw new ConnectionFileError('transport', transport, '"tcp" or "ipc"');
  const ip = r.ip ?? '127.0.0.1';
  if (typeof ip !== 'string' || ip === '') throw new ConnectionFileError('ip', ip, 'a host address');
  const key = r.key ?? '';
  if (typeof key !== 'string') throw new ConnectionFileError('key', key, 'a string');
  const scheme = r.signature_scheme ?? 'hmac-sha256';
  if (typeof scheme !== 'string') throw new ConnectionFileError('signature_scheme', scheme, 'a string such as "hmac-sha256"');
  const info = { transport, ip, key, signature_scheme: scheme } as ConnectionInfo;
  for (const name of PORTS) {
    const port = r[name];
    if (typeof port !== 'number' || !Number.isInteger(port) || port < 1 || port > 65535) throw new ConnectionFileError(name, port, 'an integer port 1–65535');
    info[name] = port;
  }
  return info;
}

export function readConnectionFile(path: string): ConnectionInfo {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (err) {
    throw new ConnectionFileError('(file)', path, `a readable file (${err instanceof Error ? err.message : String(err)})`);
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new ConnectionFileError('(file)', path, 'JSON');
  }
  return parseConnectionInfo(raw);
}

/** ZeroMQ endpoint for one channel: tcp://ip:port, or ipc://ip-port for the ipc transport (jupyter_client's form). */
export function endpoint(info: ConnectionInfo, port: number): string {
  return info.transport === 'tcp' ? `tcp://${info.ip.includes(':') ? `[${info.ip}]` : info.ip}:${port}` : `ipc://${info.ip}-${port}`;
}
