// The router and handlers against a session double, without sockets: message order, execute semantics,
// stop_on_error, interrupts, comms, history, restart, and what bad input must not do.
import { describe, expect, it } from 'vitest';
import { createMessageFactory, createSigner, encodeMessage } from '@multiplet/kernel-bridge';
import { createHarness, describeSent } from './routerHarness';

describe('request wrapping', () => {
  it('wraps kernel_info in busy → reply → idle, on shell and on control', async () => {
    const h = createHarness();
    const onShell = h.request('shell', 'kernel_info_request', {});
    const onControl = h.request('control', 'kernel_info_request', {});
    await h.router.drained();
    expect(describeSent(h.forRequest(onShell))).toEqual(['iopub:status:busy', 'shell:kernel_info_reply', 'iopub:status:idle']);
    expect(describeSent(h.forRequest(onControl))).toEqual(['iopub:status:busy', 'control:kernel_info_reply', 'iopub:status:idle']);
    const reply = h.forRequest(onShell)[1]!;
    expect(reply.identities).toEqual(['peer-1']);
    expect(reply.message.header.version).toBe('5.3');
    expect(reply.message.content).toMatchObject({ status: 'ok', protocol_version: '5.3', implementation: 'multiplet', banner: 'test double', debugger: false });
    expect((reply.message.content.language_info as { name: string }).name).toBe('multiplet-cells');
    expect((reply.message.content.help_links as unknown[]).length).toBeGreaterThan(0);
  });

  it('answers unknown message types with busy/idle only and logs them', async () => {
    const h = createHarness();
    const id = h.request('shell', 'frobnicate_request', { anything: 1 });
    await h.router.drained();
    expect(describeSent(h.forRequest(id))).toEqual(['iopub:status:busy', 'iopub:status:idle']);
    expect(h.logs.join('\n')).toContain('no handler for frobnicate_request');
  });
});

describe('execute', () => {
  it('publishes execute_input, outputs, result, then reply and idle, counting executions', async () => {
    const h = createHarness();
    const first = h.request('shell', 'execute_request', { code: 'say hello, world' });
    const second = h.request('shell', 'execute_request', { code: 'value 42' });
    await h.router.drained();
    expect(describeSent(h.forRequest(first))).toEqual(['iopub:status:busy', 'iopub:execute_input', 'iopub:stream', 'shell:execute_reply', 'iopub:status:idle']);
    const out = h.forRequest(second);
    expect(describeSent(out)).toEqual(['iopub:status:busy', 'iopub:execute_input', 'iopub:execute_result', 'shell:execute_reply', 'iopub:status:idle']);
    expect(out[1]!.message.content).toEqual({ code: 'value 42', execution_count: 2 });
    expect(out[2]!.message.content).toEqual({ execution_count: 2, data: { 'text/plain': '42' }, metadata: {}, transient: {} });
    expect(out[3]!.message.content).toMatchObject({ status: 'ok', execution_count: 2 });
  });

  it('sends display ids as transient and keeps clear_output', async () => {
    const h = createHarness();
    const show = h.request('shell', 'execute_request', { code: 'show plot' });
    const clear = h.request('shell', 'execute_request', { code: 'clear' });
    const named = h.request('shell', 'execute_request', { code: 'named levels' });
    await h.router.drained();
    expect(h.forRequest(named)[2]!.message.content.transient).toEqual({ display_id: 'r-levels' });
    const [, , display, update] = h.forRequest(show);
    expect(display!.message.content).toEqual({ data: { 'text/plain': 'plot' }, metadata: {}, transient: { display_id: 'd1' } });
    expect(update!.message.header.msg_type).toBe('update_display_data');
    expect(update!.message.content.transient).toEqual({ display_id: 'd1' });
    expect(h.forRequest(clear)[2]!.message.content).toEqual({ wait: false });
  });

  it('an error gives exactly one IOPub output and aborts queued executes under stop_on_error', async () => {
    const h = createHarness();
    const failing = h.request('shell', 'execute_request', { code: 'fail on purpose' });
    const queued = h.request('shell', 'execute_request', { code: 'say never' });
    const info = h.request('shell', 'kernel_info_request', {});
    await h.router.drained();
    expect(describeSent(h.forRequest(failing))).toEqual(['iopub:status:busy', 'iopub:execute_input', 'iopub:error', 'shell:execute_reply', 'iopub:status:idle']);
    expect(h.forRequest(failing)[3]!.message.content).toMatchObject({ status: 'error', ename: 'CellError', evalue: 'on purpose', execution_count: 1 });
    expect(h.forRequest(queued).find((s) => s.socket === 'shell')!.message.content.status).toBe('aborted');
    expect(h.session.executed).toEqual(['fail on purpose']);
    expect(h.forRequest(info)[1]!.message.content.status).toBe('ok');
    // After the abort, new executes run again.
    const later = h.request('shell', 'execute_request', { code: 'value after' });
    await h.router.drained();
    expect(h.forRequest(later)[3]!.message.content).toMatchObject({ status: 'ok', execution_count: 2 });
  });

  it('stop_on_error false lets queued executes run', async () => {
    const h = createHarness();
    h.request('shell', 'execute_request', { code: 'fail once', stop_on_error: false });
    h.request('shell', 'execute_request', { code: 'say still' });
    await h.router.drained();
    expect(h.session.executed).toEqual(['fail once', 'say still']);
  });

  it('silent runs publish nothing but busy/idle and do not count; store_history false does not count', async () => {
    const h = createHarness();
    const silent = h.request('shell', 'execute_request', { code: 'say quiet', silent: true });
    const unstored = h.request('shell', 'execute_request', { code: 'value x', store_history: false });
    await h.router.drained();
    expect(describeSent(h.forRequest(silent))).toEqual(['iopub:status:busy', 'shell:execute_reply', 'iopub:status:idle']);
    expect(h.forRequest(unstored)[1]!.message.content).toEqual({ code: 'value x', execution_count: 0 });
    expect(h.router.state.executionCount).toBe(0);
    expect(h.router.state.history.size).toBe(0);
  });

  it('survives a session that throws, reporting it as an error', async () => {
    const h = createHarness();
    const id = h.request('shell', 'execute_request', { code: 'throw' });
    await h.router.drained();
    expect(h.forRequest(id)[3]!.message.content).toMatchObject({ status: 'error', ename: 'TypeError', evalue: 'session bug' });
  });

  it('passes the notebook cell id from request metadata', async () => {
    const h = createHarness();
    const seen: (string | undefined)[] = [];
    const original = h.session.execute.bind(h.session);
    h.session.execute = (code, options) => {
      seen.push(options.cellId);
      return original(code, options);
    };
    h.request('shell', 'execute_request', { code: 'value 1' }, { cellId: 'cell-7' });
    await h.router.drained();
    expect(seen).toEqual(['cell-7']);
  });
});

describe('interrupt', () => {
  it('interrupt_request on control stops a cooperative cell within a second; the next cell runs', async () => {
    const h = createHarness();
    const spin = h.request('shell', 'execute_request', { code: 'spin' });
    const next = h.request('shell', 'execute_request', { code: 'value next', stop_on_error: false });
    await new Promise((resolve) => setTimeout(resolve, 50));
    const started = Date.now();
    const interrupt = h.request('control', 'interrupt_request', {});
    while (!h.forRequest(spin).some((s) => s.socket === 'shell')) await new Promise((resolve) => setTimeout(resolve, 5));
    expect(Date.now() - started).toBeLessThan(1000);
    expect(h.forRequest(interrupt)[1]!.message.content).toEqual({ status: 'ok' });
    expect(h.forRequest(spin).find((s) => s.socket === 'shell')!.message.content).toMatchObject({ status: 'error', ename: 'Interrupted' });
    await h.router.drained();
    // The interrupted cell had stop_on_error (default): the already queued one was aborted, as ipykernel does.
    expect(h.forRequest(next).find((s) => s.socket === 'shell')!.message.content.status).toBe('aborted');
    const after = h.request('shell', 'execute_request', { code: 'value fresh' });
    await h.router.drained();
    expect(h.forRequest(after).find((s) => s.socket === 'shell')!.message.content).toMatchObject({ status: 'ok' });
  });

  it('an interrupt with nothing running is answered and changes nothing', async () => {
    const h = createHarness();
    h.request('control', 'interrupt_request', {});
    h.request('shell', 'execute_request', { code: 'value ok' });
    await h.router.drained();
    expect(h.router.state.executionCount).toBe(1);
    expect(h.sent.filter((s) => s.message.header.msg_type === 'execute_reply')[0]!.message.content.status).toBe('ok');
  });
});

describe('completion, inspection, is_complete, history', () => {
  it('converts cursor positions between code points and string indices', async () => {
    const h = createHarness();
    // "μ" is one code point and one UTF-16 unit; "𝜇" (U+1D707) is one code point but two units.
    const id = h.request('shell', 'complete_request', { code: '𝜇 sa', cursor_pos: 4 });
    await h.router.drained();
    expect(h.session.calls).toContain('complete:𝜇 sa:5');
    expect(h.forRequest(id)[1]!.message.content).toEqual({ status: 'ok', matches: ['say'], cursor_start: 2, cursor_end: 4, metadata: {} });
  });

  it('answers inspect and is_complete from the session', async () => {
    const h = createHarness();
    const inspect = h.request('shell', 'inspect_request', { code: 'say', cursor_pos: 1, detail_level: 0 });
    const incomplete = h.request('shell', 'is_complete_request', { code: 'say \\' });
    const invalid = h.request('shell', 'is_complete_request', { code: '?' });
    await h.router.drained();
    expect(h.forRequest(inspect)[1]!.message.content).toEqual({ status: 'ok', found: true, data: { 'text/plain': 'say TEXT: print TEXT' }, metadata: {} });
    expect(h.forRequest(incomplete)[1]!.message.content).toEqual({ status: 'incomplete', indent: '  ' });
    expect(h.forRequest(invalid)[1]!.message.content).toEqual({ status: 'invalid' });
  });

  it('serves tail, range and glob search history with outputs', async () => {
    const h = createHarness();
    for (const code of ['value a', 'value b', 'say c', 'value a']) h.request('shell', 'execute_request', { code });
    const tail = h.request('shell', 'history_request', { hist_access_type: 'tail', n: 2, output: true, raw: true });
    const range = h.request('shell', 'history_request', { hist_access_type: 'range', session: 1, start: 2, stop: 3, output: false, raw: true });
    const search = h.request('shell', 'history_request', { hist_access_type: 'search', pattern: 'value*', unique: true, output: false, raw: true });
    const searchN = h.request('shell', 'history_request', { hist_access_type: 'search', pattern: 'value ?', n: 2, output: false, raw: true });
    await h.router.drained();
    expect(h.forRequest(tail)[1]!.message.content.history).toEqual([[1, 3, ['say c', null]], [1, 4, ['value a', 'a']]]);
    expect(h.forRequest(range)[1]!.message.content.history).toEqual([[1, 2, 'value b']]);
    expect(h.forRequest(search)[1]!.message.content.history).toEqual([[1, 2, 'value b'], [1, 4, 'value a']]);
    expect(h.forRequest(searchN)[1]!.message.content.history).toEqual([[1, 2, 'value b'], [1, 4, 'value a']]);
  });
});

describe('comms', () => {
  it('opens, echoes through the host on IOPub, lists and closes a comm', async () => {
    const h = createHarness();
    const open = h.request('shell', 'comm_open', { comm_id: 'c1', target_name: 'test.echo', data: {} });
    const msg = h.request('shell', 'comm_msg', { comm_id: 'c1', data: { value: 3 } });
    const info = h.request('shell', 'comm_info_request', { target_name: 'test.echo' });
    await h.router.drained();
    expect(describeSent(h.forRequest(open))).toEqual(['iopub:status:busy', 'iopub:status:idle']);
    const echoed = h.forRequest(msg);
    expect(describeSent(echoed)).toEqual(['iopub:status:busy', 'iopub:comm_msg', 'iopub:update_display_data', 'iopub:status:idle']);
    expect(echoed[1]!.message.content).toEqual({ comm_id: 'c1', data: { echo: { value: 3 } } });
    expect(h.forRequest(info)[1]!.message.content).toEqual({ status: 'ok', comms: { c1: { target_name: 'test.echo' } } });
    const close = h.request('shell', 'comm_close', { comm_id: 'c1', data: {} });
    await h.router.drained();
    expect(h.session.calls).toContain('commClose:c1');
    expect(h.router.state.comms.size).toBe(0);
    // A send from the session after the close goes nowhere.
    h.session.calls.length = 0;
    expect(describeSent(h.forRequest(close))).toEqual(['iopub:status:busy', 'iopub:status:idle']);
  });

  it('parents what the session sends on a comm to the request being handled', async () => {
    const h = createHarness();
    const open = h.request('shell', 'comm_open', { comm_id: 'c2', target_name: 'test.echo', data: {} });
    const push = h.request('shell', 'execute_request', { code: 'push now' });
    await h.router.drained();
    const pushed = h.forRequest(push).find((s) => s.message.header.msg_type === 'comm_msg');
    expect(pushed?.message.content).toEqual({ comm_id: 'c2', data: { pushed: 'now' } });
    // Outside any request, the latest request on the comm is the parent.
    h.session.hosts.get('c2')!.send({ late: true });
    await h.router.drained();
    expect(h.forRequest(open).filter((s) => s.message.header.msg_type === 'comm_msg').map((s) => s.message.content.data)).toEqual([{ late: true }]);
  });

  it('answers an unknown or refused target with comm_close', async () => {
    const h = createHarness();
    const unknown = h.request('shell', 'comm_open', { comm_id: 'u', target_name: 'nope', data: {} });
    const refused = h.request('shell', 'comm_open', { comm_id: 'r', target_name: 'test.echo', data: { refuse: true } });
    await h.router.drained();
    expect(h.forRequest(unknown)[1]!.message.content).toEqual({ comm_id: 'u', data: {} });
    expect(h.forRequest(unknown)[1]!.message.header.msg_type).toBe('comm_close');
    expect(h.forRequest(refused)[1]!.message.header.msg_type).toBe('comm_close');
    expect(h.router.state.comms.size).toBe(0);
    expect(h.session.calls).not.toContain('openComm:nope:u');
  });
});

describe('shutdown', () => {
  it('restart resets session and kernel state and keeps serving', async () => {
    const h = createHarness();
    h.request('shell', 'execute_request', { code: 'value 1' });
    h.request('shell', 'comm_open', { comm_id: 'c', target_name: 'test.echo', data: {} });
    await h.router.drained();
    const id = h.request('control', 'shutdown_request', { restart: true });
    await h.router.drained();
    expect(describeSent(h.forRequest(id))).toEqual(['iopub:status:busy', 'control:shutdown_reply', 'iopub:shutdown_reply', 'iopub:status:idle']);
    expect(h.shutdowns).toEqual([true]);
    expect(h.session.resets).toBe(1);
    expect(h.router.state.executionCount).toBe(0);
    expect(h.router.state.comms.size).toBe(0);
    const after = h.request('shell', 'execute_request', { code: 'value 2' });
    await h.router.drained();
    expect(h.forRequest(after)[3]!.message.content).toMatchObject({ status: 'ok', execution_count: 1 });
  });

  it('a final shutdown stops serving', async () => {
    const h = createHarness();
    h.request('control', 'shutdown_request', { restart: false });
    await h.router.drained();
    expect(h.shutdowns).toEqual([false]);
    const late = h.request('shell', 'execute_request', { code: 'value late' });
    await h.router.drained();
    expect(h.forRequest(late)).toEqual([]);
    expect(h.session.executed).toEqual([]);
  });
});

describe('signatures at the router', () => {
  it('drops wrongly signed, unsigned and replayed messages without replying or touching the session', async () => {
    const h = createHarness();
    const client = createMessageFactory({ session: 'intruder' });
    const forged = client.message('execute_request', { code: 'value forged' }, undefined);
    h.router.receive('shell', encodeMessage([Buffer.from('x')], forged, createSigner('wrong-key')));
    h.router.receive('control', encodeMessage([Buffer.from('x')], client.message('shutdown_request', { restart: false }, undefined), createSigner('')));
    await h.router.drained();
    expect(h.sent).toEqual([]);
    expect(h.session.calls).toEqual([]);
    expect(h.shutdowns).toEqual([]);
    expect(h.logs.join('\n')).toMatch(/bad signature[\s\S]*missing signature/);

    const good = client.message('execute_request', { code: 'value once' }, undefined);
    const frames = encodeMessage([Buffer.from('x')], good, createSigner('router-test-key'));
    h.router.receive('shell', frames);
    h.router.receive('shell', frames);
    await h.router.drained();
    expect(h.session.executed).toEqual(['value once']);
    expect(h.logs.join('\n')).toContain('replayed');
  });

  it('ignores stdin traffic', async () => {
    const h = createHarness();
    h.request('stdin', 'input_reply', { value: 'x' });
    await h.router.drained();
    expect(h.sent).toEqual([]);
  });
});
