// fast-check properties of the router: random and malformed protocol input never throws, never hangs, and
// never changes kernel or session state; well-signed but malformed requests still get busy/idle.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DELIMITER, createMessageFactory, createSigner, encodeMessage } from '@multiplet/kernel-bridge';
import { createCellSession } from '@multiplet/cells';
import { createHarness, TEST_KEY, type Harness } from './routerHarness';

const snapshot = (h: Harness) =>
  JSON.stringify({
    count: h.router.state.executionCount,
    history: h.router.state.history.query({ accessType: 'tail', output: true }),
    comms: h.router.state.comms.info(),
    executed: h.session.executed,
    resets: h.session.resets,
    shutdowns: h.shutdowns,
  });

const withTimeout = <T>(p: Promise<T>, ms: number) =>
  Promise.race([p, new Promise<never>((_, reject) => setTimeout(() => reject(new Error(`router did not drain in ${ms} ms`)), ms))]);

describe('router properties (fast-check)', () => {
  const socket = fc.constantFrom('shell' as const, 'control' as const, 'stdin' as const);
  const frame = fc.oneof(
    fc.uint8Array({ maxLength: 48 }).map((a) => Buffer.from(a)),
    fc.json({ maxDepth: 2 }).map((s) => Buffer.from(s)),
    fc.constant(DELIMITER),
    fc.constant(Buffer.from('{}')),
  );

  it('random frames are dropped: no reply, no session call, no state change', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(fc.tuple(socket, fc.array(frame, { maxLength: 9 })), { maxLength: 8 }), async (deliveries) => {
        const h = createHarness();
        const before = snapshot(h);
        for (const [s, frames] of deliveries) h.router.receive(s, frames);
        await withTimeout(h.router.drained(), 2000);
        expect(h.sent).toEqual([]);
        expect(h.session.calls).toEqual([]);
        expect(snapshot(h)).toBe(before);
      }),
      { numRuns: 200 },
    );
  });

  it('signed requests with malformed content get busy … idle and change no state', async () => {
    const msgType = fc.constantFrom(
      'kernel_info_request', 'execute_request', 'complete_request', 'inspect_request', 'is_complete_request', 'history_request',
      'comm_open', 'comm_msg', 'comm_close', 'comm_info_request', 'interrupt_request', 'no_such_request', '',
    );
    // Any JSON for every field, except that an execute_request never carries a string `code` (that would run).
    const content = fc.dictionary(fc.constantFrom('code', 'cursor_pos', 'detail_level', 'comm_id', 'target_name', 'data', 'hist_access_type', 'n', 'pattern', 'silent', 'restart', 'other'), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 5 });
    const signer = createSigner(TEST_KEY);
    await fc.assert(
      fc.asyncProperty(fc.array(fc.tuple(socket, msgType, content, fc.jsonValue({ maxDepth: 2 })), { minLength: 1, maxLength: 6 }), async (requests) => {
        const h = createHarness();
        const client = createMessageFactory({ session: 'fuzz' });
        const before = snapshot(h);
        const ids: { id: string; socket: string; type: string }[] = [];
        for (const [s, type, c, metadata] of requests) {
          if (type === 'execute_request' && typeof c.code === 'string') delete c.code;
          const message = client.message(type, c, undefined, metadata !== null && typeof metadata === 'object' && !Array.isArray(metadata) ? (metadata as Record<string, unknown>) : {});
          h.router.receive(s, encodeMessage([Buffer.from('p')], message, signer));
          ids.push({ id: message.header.msg_id, socket: s, type });
        }
        await withTimeout(h.router.drained(), 2000);
        expect(snapshot(h)).toBe(before);
        expect(h.session.executed).toEqual([]);
        for (const { id, socket: s, type } of ids) {
          const sent = h.forRequest(id);
          if (s === 'stdin' || type === '') {
            // stdin is ignored; an empty msg_type is not a message at all.
            expect(sent).toEqual([]);
            continue;
          }
          expect(sent[0]!.message.content).toEqual({ execution_state: 'busy' });
          expect(sent[sent.length - 1]!.message.content).toEqual({ execution_state: 'idle' });
          for (const reply of sent.filter((m) => m.socket !== 'iopub')) expect(['ok', 'error', 'complete', 'incomplete', 'invalid', 'unknown']).toContain(reply.message.content.status);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('with the real cells session: malformed requests leave the sample state byte-for-byte unchanged', async () => {
    const h = createHarness(createCellSession({ notebookDir: process.cwd() }));
    h.request('shell', 'execute_request', { code: '[sample] host\ncompound: DyQ-1\nion: Dy3+\nsiteSymmetry: D3d' });
    await h.router.drained();
    expect(h.session.state.names()).toEqual(['host']);
    const before = h.session.state.serialize();
    const count = h.router.state.executionCount;
    const signer = createSigner(TEST_KEY);
    const client = createMessageFactory({ session: 'fuzz-real' });
    const msgType = fc.constantFrom('execute_request', 'complete_request', 'inspect_request', 'is_complete_request', 'history_request', 'comm_open', 'comm_msg', 'comm_info_request', 'kernel_info_request');
    const content = fc.record(
      {
        code: fc.oneof(fc.integer(), fc.constant(null), fc.array(fc.string({ maxLength: 5 }), { maxLength: 2 }), fc.string({ maxLength: 60 })),
        cursor_pos: fc.oneof(fc.integer({ min: -5, max: 80 }), fc.double(), fc.string({ maxLength: 3 })),
        comm_id: fc.oneof(fc.string({ maxLength: 6 }), fc.integer()),
        target_name: fc.string({ maxLength: 12 }),
        data: fc.jsonValue({ maxDepth: 2 }),
        hist_access_type: fc.oneof(fc.constantFrom('tail', 'range', 'search'), fc.string({ maxLength: 4 })),
      },
      { requiredKeys: [] },
    );
    await fc.assert(
      fc.asyncProperty(fc.array(fc.tuple(fc.constantFrom('shell' as const, 'control' as const), msgType, content), { minLength: 1, maxLength: 5 }), async (requests) => {
        for (const [s, type, c] of requests) {
          // A string `code` in an execute_request is a real cell: only the malformed ones are fed here.
          const body: Record<string, unknown> = { ...c };
          if (type === 'execute_request' && typeof body.code === 'string') body.code = 42;
          h.router.receive(s, encodeMessage([Buffer.from('p')], client.message(type, body, undefined), signer));
          // Unsigned garbage alongside.
          h.router.receive(s, [DELIMITER, Buffer.from(''), Buffer.from(JSON.stringify(body))]);
        }
        await withTimeout(h.router.drained(), 5000);
        expect(h.session.state.serialize()).toBe(before);
        expect(h.router.state.executionCount).toBe(count);
      }),
      { numRuns: 60 },
    );
  });
});
