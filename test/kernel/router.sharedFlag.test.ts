// With the control worker, the running task's cancel flag is a slot shared with it: the worker sets it the moment
// an interrupt_request arrives, so a cell that never yields to the event loop (a synchronous fit checking
// task.checkpoint()) still stops. SIGINTs the worker raised for a task that has ended are not applied to the next.
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { createMessageFactory, createSigner, decodeMessage, encodeMessage, KernelRouter, KERNEL_IDENTITY, type JupyterMessage } from '@multiplet/kernel-bridge';
import type { CellSession, ExecuteOptions, ExecuteOutcome } from '@multiplet/cells/protocol';
import { CANCEL_REQUESTED, SHARED_SLOTS, SIGINT_TARGET, TASK_GENERATION, TASK_RUNNING } from '../../kernel-bridge/src/controlChannel';
import { createSessionDouble } from './sessionDouble';

/** "block" busy-waits on the thread looking only at the cancel flag (no await inside); "wait" polls it between timers. */
function blockingSession(seen: Int32Array[]): CellSession {
  const base = createSessionDouble();
  return {
    ...base,
    async execute(code: string, options: ExecuteOptions): Promise<ExecuteOutcome> {
      const flag = options.cancelFlag!;
      if (code === 'wait') {
        // Cooperative: polls the flag between timer turns.
        seen.push(flag);
        while (Atomics.load(flag, 0) === 0) await new Promise((r) => setTimeout(r, 5));
        return { status: 'error', ename: 'CellInterrupted', evalue: 'interrupted', traceback: [] };
      }
      if (code !== 'block') return base.execute(code, options);
      seen.push(flag);
      const until = performance.now() + 5000;
      while (Atomics.load(flag, 0) === 0) if (performance.now() > until) return { status: 'ok', result: { data: { 'text/plain': 'ran to the end' }, metadata: {} } };
      return { status: 'error', ename: 'CellInterrupted', evalue: 'interrupted', traceback: [] };
    },
  };
}

function setup(session: CellSession) {
  const signer = createSigner('k');
  const client = createMessageFactory({ session: 'client' });
  const taskState = new Int32Array(new SharedArrayBuffer(SHARED_SLOTS * 4));
  const sent: JupyterMessage[] = [];
  const router = new KernelRouter({
    session,
    signer,
    factory: createMessageFactory({ session: 'kernel' }),
    identity: KERNEL_IDENTITY,
    send: async (_socket, frames) => {
      const decoded = decodeMessage(frames, signer);
      if (decoded.ok) sent.push(decoded.value);
    },
    log: () => {},
    taskState,
  });
  const execute = (code: string) => {
    const message = client.message('execute_request', { code, silent: false }, undefined);
    router.receive('shell', encodeMessage([Buffer.from('peer')], message, signer));
    return message.header.msg_id;
  };
  const reply = async (msgId: string) => {
    for (let i = 0; i < 500; i++) {
      const found = sent.find((m) => m.header.msg_type === 'execute_reply' && m.parent_header.msg_id === msgId);
      if (found) return found;
      await new Promise((r) => setTimeout(r, 10));
    }
    throw new Error('no execute_reply');
  };
  return { router, taskState, execute, reply };
}

describe('cancel flag shared with the control worker', () => {
  it('a flag slot set from another thread stops a cell that never yields; the next cell starts with a clear flag', async () => {
    const seen: Int32Array[] = [];
    const { taskState, execute, reply } = setup(blockingSession(seen));
    // Stands in for the control worker: waits until a task runs, then sets the shared slot.
    const worker = new Worker(
      `const { workerData } = require('node:worker_threads');
       const slots = new Int32Array(workerData);
       while (Atomics.load(slots, ${TASK_RUNNING}) !== 1) Atomics.wait(slots, ${TASK_RUNNING}, 0, 5);
       Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 100);
       Atomics.store(slots, ${CANCEL_REQUESTED}, 1);`,
      { eval: true, workerData: taskState.buffer },
    );
    const started = performance.now();
    const first = await reply(execute('block'));
    await worker.terminate();
    expect(performance.now() - started).toBeLessThan(1000);
    expect(first.content).toMatchObject({ status: 'error', ename: 'CellInterrupted' });
    expect(seen[0]!.buffer).toBe(taskState.buffer);
    expect(Atomics.load(taskState, TASK_RUNNING)).toBe(0);
    const second = await reply(execute('value fine'));
    expect(second.content).toMatchObject({ status: 'ok' });
    expect(Atomics.load(taskState, CANCEL_REQUESTED)).toBe(0);
    expect(Atomics.load(taskState, TASK_GENERATION)).toBe(2);
  });

  it('interruptFromSignal: a SIGINT raised for an earlier task is ignored, a user SIGINT interrupts the running one', async () => {
    const seen: Int32Array[] = [];
    const { router, taskState, execute, reply } = setup(blockingSession(seen));
    expect(router.interruptFromSignal()).toBe(true); // nothing runs: no effect, no error
    expect((await reply(execute('value earlier'))).content).toMatchObject({ status: 'ok' });
    const pending = execute('wait');
    while (Atomics.load(taskState, TASK_RUNNING) !== 1) await new Promise((r) => setTimeout(r, 5));
    const generation = Atomics.load(taskState, TASK_GENERATION);
    Atomics.store(taskState, SIGINT_TARGET, generation - 1);
    expect(router.interruptFromSignal()).toBe(false);
    expect(Atomics.load(taskState, SIGINT_TARGET)).toBe(0);
    Atomics.store(taskState, SIGINT_TARGET, generation);
    expect(router.interruptFromSignal()).toBe(true);
    expect((await reply(pending)).content).toMatchObject({ ename: 'CellInterrupted' });
  });
});
