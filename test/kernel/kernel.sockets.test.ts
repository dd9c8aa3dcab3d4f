// The kernel over real ZeroMQ sockets (zeromq 6), in-process with the session double: heartbeat, shell and
// control routing, IOPub order, a burst of outputs (per-socket send queues: no EBUSY), interrupt timing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer } from 'node:net';
import { Dealer, Request, Subscriber } from 'zeromq';
import { createMessageFactory, createSigner, decodeMessage, encodeMessage, startKernel, type ConnectionInfo, type JupyterMessage, type RunningKernel } from '@multiplet/kernel-bridge';
import { createSessionDouble } from './sessionDouble';

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

const KEY = 'sockets-test-key';
let info: ConnectionInfo;
let kernel: RunningKernel;
let shell: Dealer;
let control: Dealer;
let iopub: Subscriber;
let heartbeat: Request;
const signer = createSigner(KEY);
const client = createMessageFactory({ session: 'socket-client' });
const iopubLog: JupyterMessage[] = [];
const logs: string[] = [];

async function send(socket: Dealer, msgType: string, content: Record<string, unknown>): Promise<string> {
  const message = client.message(msgType, content, undefined);
  await socket.send(encodeMessage([], message, signer));
  return message.header.msg_id;
}

async function receive(socket: Dealer): Promise<JupyterMessage> {
  const frames = await socket.receive();
  const decoded = decodeMessage(frames, signer);
  if (!decoded.ok) throw new Error(decoded.reason);
  return decoded.value;
}

async function waitForIdle(msgId: string, timeoutMs = 5000): Promise<JupyterMessage[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const mine = iopubLog.filter((m) => m.parent_header.msg_id === msgId);
    if (mine.some((m) => m.header.msg_type === 'status' && m.content.execution_state === 'idle')) return mine;
    if (Date.now() > deadline) throw new Error(`no idle for ${msgId}`);
    await new Promise((resolve) => setTimeout(resolve, 5));
  }
}

beforeAll(async () => {
  info = {
    transport: 'tcp', ip: '127.0.0.1', key: KEY, signature_scheme: 'hmac-sha256',
    shell_port: await freePort(), iopub_port: await freePort(), stdin_port: await freePort(), control_port: await freePort(), hb_port: await freePort(),
  };
  kernel = await startKernel({ connection: info, session: createSessionDouble(), log: (t) => logs.push(t) });
  shell = new Dealer({ linger: 0, receiveTimeout: 5000 });
  control = new Dealer({ linger: 0, receiveTimeout: 5000 });
  iopub = new Subscriber({ linger: 0 });
  heartbeat = new Request({ linger: 0, receiveTimeout: 2000 });
  shell.connect(`tcp://127.0.0.1:${info.shell_port}`);
  control.connect(`tcp://127.0.0.1:${info.control_port}`);
  iopub.connect(`tcp://127.0.0.1:${info.iopub_port}`);
  iopub.subscribe();
  heartbeat.connect(`tcp://127.0.0.1:${info.hb_port}`);
  void (async () => {
    try {
      for await (const frames of iopub) {
        const decoded = decodeMessage(frames, signer);
        if (decoded.ok) iopubLog.push(decoded.value);
      }
    } catch {
      // closed in afterAll
    }
  })();
  // PUB/SUB joins late: repeat kernel_info until its IOPub status arrives (what jupyter_client does too).
  for (let i = 0; i < 50; i++) {
    const id = await send(shell, 'kernel_info_request', {});
    await receive(shell);
    await new Promise((resolve) => setTimeout(resolve, 50));
    if (iopubLog.some((m) => m.parent_header.msg_id === id)) break;
  }
});

afterAll(async () => {
  for (const s of [shell, control, iopub, heartbeat]) s?.close();
  await kernel?.stop();
});

describe('kernel over ZeroMQ', () => {
  it('echoes heartbeats', async () => {
    await heartbeat.send('ping');
    const [echo] = await heartbeat.receive();
    expect(String(echo)).toBe('ping');
  });

  it('answers kernel_info on control with IOPub activity', async () => {
    const id = await send(control, 'kernel_info_request', {});
    const reply = await receive(control);
    expect(reply.header.msg_type).toBe('kernel_info_reply');
    expect(reply.parent_header.msg_id).toBe(id);
    const seen = await waitForIdle(id);
    expect(seen[0]!.content).toEqual({ execution_state: 'busy' });
  });

  it('delivers a burst of executes and outputs in order (no EBUSY)', async () => {
    const ids: string[] = [];
    for (let i = 0; i < 40; i++) ids.push(await send(shell, 'execute_request', { code: i % 2 ? `show n${i}` : `say n${i}` }));
    const replies: JupyterMessage[] = [];
    for (let i = 0; i < 40; i++) replies.push(await receive(shell));
    expect(replies.map((r) => r.parent_header.msg_id)).toEqual(ids);
    expect(replies.every((r) => r.content.status === 'ok')).toBe(true);
    const last = await waitForIdle(ids[39]!);
    expect(last.map((m) => m.header.msg_type)).toEqual(['status', 'execute_input', 'display_data', 'update_display_data', 'status']);
    expect(logs.filter((l) => /EBUSY|busy writing/i.test(l))).toEqual([]);
  });

  it('interrupts a running cell from control within a second; the next cell runs', async () => {
    const spin = await send(shell, 'execute_request', { code: 'spin' });
    await new Promise((resolve) => setTimeout(resolve, 100));
    const started = Date.now();
    await send(control, 'interrupt_request', {});
    const interruptReply = await receive(control);
    expect(interruptReply.content).toEqual({ status: 'ok' });
    const reply = await receive(shell);
    expect(Date.now() - started).toBeLessThan(1000);
    expect(reply.parent_header.msg_id).toBe(spin);
    expect(reply.content).toMatchObject({ status: 'error', ename: 'Interrupted' });
    const next = await send(shell, 'execute_request', { code: 'value after' });
    const nextReply = await receive(shell);
    expect(nextReply.parent_header.msg_id).toBe(next);
    expect(nextReply.content.status).toBe('ok');
  });

  it('drops a message signed with the wrong key and keeps serving', async () => {
    const countBefore = kernel.router.state.executionCount;
    const forged = client.message('execute_request', { code: 'value forged' }, undefined);
    await shell.send(encodeMessage([], forged, createSigner('not-the-key')));
    const id = await send(shell, 'execute_request', { code: 'value real' });
    const reply = await receive(shell);
    expect(reply.parent_header.msg_id).toBe(id);
    expect(reply.content.execution_count).toBe(countBefore + 1);
    expect(iopubLog.some((m) => m.parent_header.msg_id === forged.header.msg_id)).toBe(false);
    expect(logs.some((l) => l.includes('bad signature'))).toBe(true);
  });
});
