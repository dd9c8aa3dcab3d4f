// fast-check cases of the list not covered in router.property.test.ts: correctly signed messages whose
// header, parent_header, metadata or content frames are not the JSON objects the protocol requires (a client bug,
// not an attacker), and the clarity of every error reply to a malformed request. Each time: no throw, no hang, a
// clear reason (in the log for dropped messages, in the reply for answered ones) and the sample state unchanged.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DELIMITER, createMessageFactory, createSigner, encodeMessage } from '@multiplet/kernel-bridge';
import { createCellSession } from '@multiplet/cells';
import { createHarness, TEST_KEY } from './routerHarness';

const withTimeout = <T>(p: Promise<T>, ms: number) =>
  Promise.race([p, new Promise<never>((_, reject) => setTimeout(() => reject(new Error(`router did not drain in ${ms} ms`)), ms))]);

const SAMPLE = '[sample] host\ncompound: DyQ-1\nion: Dy3+\nsiteSymmetry: D3d';

describe('router: malformed but correctly signed messages (fast-check)', () => {
  it('bad JSON or non-object frames are dropped with a logged reason; the state is byte-for-byte unchanged', async () => {
    const h = createHarness(createCellSession({ notebookDir: process.cwd() }));
    h.request('shell', 'execute_request', { code: SAMPLE });
    await h.router.drained();
    const before = h.session.state.serialize();
    const count = h.router.state.executionCount;
    const signer = createSigner(TEST_KEY);
    const client = createMessageFactory({ session: 'fuzz-frames' });
    const isObjectJson = (b: Buffer) => {
      try {
        const v: unknown = JSON.parse(b.toString('utf8'));
        return v !== null && typeof v === 'object' && !Array.isArray(v);
      } catch {
        return false;
      }
    };
    // Any of the four frames not a JSON object ...
    const notObject = fc
      .oneof(
        fc.jsonValue({ maxDepth: 2 }).map((v) => Buffer.from(JSON.stringify(v))),
        fc.string({ maxLength: 20 }).map((s) => Buffer.from(`{${s}`)),
        fc.uint8Array({ maxLength: 24 }).map((a) => Buffer.from(a)),
      )
      .filter((b) => !isObjectJson(b));
    // ... or a header object without a usable msg_id / msg_type.
    const badHeader = fc
      .record({ msg_id: fc.oneof(fc.integer(), fc.constant(null)), msg_type: fc.oneof(fc.constant(''), fc.integer(), fc.constant('execute_request')) }, { requiredKeys: [] })
      .map((o) => Buffer.from(JSON.stringify(o)));
    const broken = fc.oneof(fc.tuple(fc.nat(3), notObject), fc.tuple(fc.constant(0), badHeader));
    await fc.assert(
      fc.asyncProperty(fc.constantFrom('shell' as const, 'control' as const), broken, fc.array(fc.uint8Array({ maxLength: 8 }), { maxLength: 2 }), async (socket, [which, bad], buffers) => {
        const message = client.message('execute_request', { code: '[sample] other\ncompound: X\nion: Ho3+' }, undefined);
        const parts = [message.header, message.parent_header, message.metadata, message.content].map((p) => Buffer.from(JSON.stringify(p)));
        parts[which] = bad;
        const signature = Buffer.from(signer.sign(parts as [Buffer, Buffer, Buffer, Buffer]), 'ascii');
        const sentBefore = h.sent.length;
        const logsBefore = h.logs.length;
        expect(() => h.router.receive(socket, [Buffer.from('peer'), DELIMITER, signature, ...parts, ...buffers.map((b) => Buffer.from(b))])).not.toThrow();
        await withTimeout(h.router.drained(), 2000);
        expect(h.sent.length).toBe(sentBefore);
        const logged = h.logs.slice(logsBefore).join('\n');
        expect(logged).toMatch(/dropped a message on (shell|control): (header|parent_header|metadata|content)\b|header lacks a string msg_id and msg_type/);
        expect(h.session.state.serialize()).toBe(before);
        expect(h.router.state.executionCount).toBe(count);
      }),
      { numRuns: 150, seed: 20261202 },
    );
    expect(h.logs.filter((l) => l.startsWith('dropped a message')).length).toBeGreaterThanOrEqual(150);
  });

  it('every error reply to a malformed request names what was wrong', async () => {
    const h = createHarness(createCellSession({ notebookDir: process.cwd() }));
    h.request('shell', 'execute_request', { code: SAMPLE });
    await h.router.drained();
    const before = h.session.state.serialize();
    const signer = createSigner(TEST_KEY);
    const client = createMessageFactory({ session: 'fuzz-replies' });
    let errors = 0;
    const notString = fc.oneof(fc.integer(), fc.constant(null), fc.boolean(), fc.array(fc.integer(), { maxLength: 2 }), fc.dictionary(fc.string({ maxLength: 3 }), fc.integer(), { maxKeys: 2 }));
    const request = fc.oneof(
      fc.record({ type: fc.constant('execute_request'), content: fc.record({ code: notString, silent: fc.jsonValue({ maxDepth: 1 }) }, { requiredKeys: ['code'] }) }),
      fc.record({ type: fc.constant('complete_request'), content: fc.record({ code: fc.oneof(notString, fc.string({ maxLength: 10 })), cursor_pos: fc.oneof(notString, fc.integer({ min: -10, max: 40 }), fc.double()) }, { requiredKeys: [] }) }),
      fc.record({ type: fc.constant('inspect_request'), content: fc.record({ code: fc.oneof(notString, fc.string({ maxLength: 10 })), cursor_pos: fc.oneof(notString, fc.integer({ min: -10, max: 40 })), detail_level: fc.jsonValue({ maxDepth: 1 }) }, { requiredKeys: [] }) }),
      fc.record({ type: fc.constant('is_complete_request'), content: fc.record({ code: notString }, { requiredKeys: [] }) }),
      fc.record({ type: fc.constant('history_request'), content: fc.record({ hist_access_type: fc.oneof(notString, fc.string({ maxLength: 6 })), n: fc.jsonValue({ maxDepth: 1 }), start: fc.jsonValue({ maxDepth: 1 }) }, { requiredKeys: [] }) }),
    );
    await fc.assert(
      fc.asyncProperty(request, async ({ type, content }) => {
        const message = client.message(type, content as Record<string, unknown>, undefined);
        h.router.receive('shell', encodeMessage([Buffer.from('p')], message, signer));
        await withTimeout(h.router.drained(), 5000);
        const replies = h.forRequest(message.header.msg_id).filter((s) => s.socket === 'shell');
        expect(replies).toHaveLength(1);
        const reply = replies[0]!.message.content as { status: string; ename?: string; evalue?: string };
        if (reply.status === 'error') {
          errors++;
          expect(reply.ename).toMatch(/^[A-Z]\w+$/);
          // The field that was wrong, what was expected and what came.
          expect(reply.evalue).toMatch(/^\w+: expected .+, got .+/);
        }
        expect(h.session.state.serialize()).toBe(before);
      }),
      { numRuns: 150, seed: 5 },
    );
    expect(errors).toBeGreaterThan(50);
  });
});
