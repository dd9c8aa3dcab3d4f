/**
 * A small stand-in for the cells session, used only by the kernel-bridge tests so that the transport can be
 * checked on its own. Its "language" is one command per cell:
 *   say TEXT        → stdout stream
 *   warn TEXT       → stderr stream
 *   value TEXT      → execute_result text/plain TEXT
 *   named TEXT      → execute_result with display id r-TEXT
 *   show TEXT       → display_data (display id "d1"), then update_display_data
 *   push TEXT       → sends {pushed: TEXT} on every open comm
 *   clear           → clear_output
 *   fail TEXT       → error outcome
 *   spin            → cooperative loop until the cancel flag is set (then an Interrupted error)
 *   throw           → the session throws (a bug the host must survive)
 * Every call is recorded so tests can assert what reached the session.
 */
import type { CellSession, CommHost, ExecuteOptions, ExecuteOutcome } from '@multiplet/cells/protocol';

export interface SessionDouble extends CellSession {
  calls: string[];
  executed: string[];
  hosts: Map<string, CommHost>;
  resets: number;
}

export function createSessionDouble(): SessionDouble {
  const calls: string[] = [];
  const executed: string[] = [];
  const hosts = new Map<string, CommHost>();
  const double: SessionDouble = {
    calls,
    executed,
    hosts,
    resets: 0,
    async execute(code: string, options: ExecuteOptions): Promise<ExecuteOutcome> {
      calls.push(`execute:${code}`);
      executed.push(code);
      const [command, ...rest] = code.trim().split(' ');
      const text = rest.join(' ');
      switch (command) {
        case 'say':
          options.emit({ type: 'stream', name: 'stdout', text: text + '\n' });
          return { status: 'ok' };
        case 'warn':
          options.emit({ type: 'stream', name: 'stderr', text: text + '\n' });
          return { status: 'ok' };
        case 'value':
          return { status: 'ok', result: { data: { 'text/plain': text }, metadata: {} } };
        case 'named':
          return { status: 'ok', result: { data: { 'text/plain': text }, metadata: {}, displayId: `r-${text}` } };
        case 'show':
          options.emit({ type: 'display_data', data: { 'text/plain': text }, metadata: {}, displayId: 'd1' });
          options.emit({ type: 'update_display_data', data: { 'text/plain': text + '!' }, metadata: {}, displayId: 'd1' });
          return { status: 'ok' };
        case 'push':
          for (const host of hosts.values()) host.send({ pushed: text });
          return { status: 'ok' };
        case 'clear':
          options.emit({ type: 'clear_output', wait: false });
          return { status: 'ok' };
        case 'fail':
          return { status: 'error', ename: 'CellError', evalue: text, traceback: [`CellError: ${text}`] };
        case 'spin': {
          const flag = options.cancelFlag;
          while (!flag || Atomics.load(flag, 0) === 0) await new Promise((resolve) => setImmediate(resolve));
          return { status: 'error', ename: 'Interrupted', evalue: 'interrupted by the user', traceback: ['Interrupted'] };
        }
        case 'throw':
          throw new TypeError('session bug');
        default:
          return { status: 'ok' };
      }
    },
    complete(code, cursorPos) {
      calls.push(`complete:${code}:${cursorPos}`);
      const start = code.lastIndexOf(' ', cursorPos - 1) + 1;
      const prefix = code.slice(start, cursorPos);
      return { matches: ['say', 'show', 'spin'].filter((w) => w.startsWith(prefix)), cursorStart: start, cursorEnd: cursorPos };
    },
    inspect(code, cursorPos) {
      calls.push(`inspect:${code}:${cursorPos}`);
      return code.startsWith('say') ? { found: true, data: { 'text/plain': 'say TEXT: print TEXT' } } : { found: false, data: {} };
    },
    isComplete(code) {
      calls.push(`isComplete:${code}`);
      return code.endsWith('\\') ? { status: 'incomplete', indent: '  ' } : code.startsWith('?') ? { status: 'invalid' } : { status: 'complete' };
    },
    commTargets: () => ['test.echo'],
    openComm(target, commId, data, host) {
      calls.push(`openComm:${target}:${commId}`);
      if ((data as { refuse?: boolean } | null)?.refuse) return undefined;
      hosts.set(commId, host);
      return {
        async onMessage(payload, options) {
          calls.push(`commMsg:${commId}`);
          host.send({ echo: payload });
          options.emit({ type: 'update_display_data', data: { 'text/plain': 'moved' }, metadata: {}, displayId: 'd1' });
        },
        onClose() {
          calls.push(`commClose:${commId}`);
          hosts.delete(commId);
        },
      };
    },
    languageInfo: () => ({ name: 'multiplet-cells', version: '0.1.0', mimetype: 'text/x-multiplet', file_extension: '.mplt' }),
    banner: () => 'test double',
    reset() {
      double.resets++;
      calls.push('reset');
    },
  };
  return double;
}
