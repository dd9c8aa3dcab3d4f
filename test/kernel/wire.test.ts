// Golden frames and signatures for the wire format. The golden values were produced with Debian's
// python3-jupyter-client 7.4.9 (`jupyter_client.session.Session(key=b"multiplet-golden-key").serialize(...)`
// and `hmac.new(key, digestmod=hashlib.sha256)` over our compact frames), i.e. by the reference implementation.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createSigner, decodeMessage, encodeMessage, splitFrames, DELIMITER, SignatureSchemeError } from '@multiplet/kernel-bridge';

const KEY = 'multiplet-golden-key';
const b = (s: string) => Buffer.from(s, 'utf8');

const GOLDEN_FROM_JUPYTER_CLIENT = [
  b('client-id'),
  b('<IDS|MSG>'),
  b('83db52ec40f880d9b4e329d7c130e10176cbca463223efdc1bf58cea468b43c2'),
  b('{"msg_id": "golden-1", "msg_type": "execute_request", "session": "golden-session", "username": "golden", "date": "2026-01-01T00:00:00.000000Z", "version": "5.3"}'),
  b('{}'),
  b('{}'),
  b('{"code": "μB = 1", "silent": false}'),
];

describe('signing (golden values from jupyter_client)', () => {
  it('verifies a message signed by jupyter_client, frames as received', () => {
    const decoded = decodeMessage(GOLDEN_FROM_JUPYTER_CLIENT, createSigner(KEY));
    expect(decoded.ok).toBe(true);
    if (!decoded.ok) return;
    expect(decoded.value.identities.map(String)).toEqual(['client-id']);
    expect(decoded.value.header.msg_type).toBe('execute_request');
    expect(decoded.value.content).toEqual({ code: 'μB = 1', silent: false });
  });

  it('signs our compact frames exactly as Python hmac does', () => {
    const message = {
      header: { msg_id: 'golden-reply', msg_type: 'status', session: 'kernel-session', username: 'multiplet', date: '2026-01-01T00:00:00.000Z', version: '5.3' },
      parent_header: {},
      metadata: {},
      content: { execution_state: 'idle' },
      buffers: [],
    };
    const frames = encodeMessage([], message, createSigner(KEY));
    expect(frames[0]!.equals(DELIMITER)).toBe(true);
    expect(frames[1]!.toString()).toBe('369df15d6db63dc04add9173135f67afc3bcb60908d33e9e12e963eeba23cc62');
    expect(frames[2]!.toString()).toBe('{"msg_id":"golden-reply","msg_type":"status","session":"kernel-session","username":"multiplet","date":"2026-01-01T00:00:00.000Z","version":"5.3"}');
    expect(frames.slice(3).map(String)).toEqual(['{}', '{}', '{"execution_state":"idle"}']);
  });

  it('rejects the golden message under a wrong key, a missing signature and a re-serialised body', () => {
    expect(decodeMessage(GOLDEN_FROM_JUPYTER_CLIENT, createSigner('other-key'))).toEqual({ ok: false, reason: 'bad signature' });
    const missing = [...GOLDEN_FROM_JUPYTER_CLIENT];
    missing[2] = b('');
    expect(decodeMessage(missing, createSigner(KEY))).toEqual({ ok: false, reason: 'missing signature' });
    // Same JSON meaning, different bytes: the signature covers bytes, so this must fail.
    const respaced = [...GOLDEN_FROM_JUPYTER_CLIENT];
    respaced[6] = b('{"code":"μB = 1","silent":false}');
    expect(decodeMessage(respaced, createSigner(KEY)).ok).toBe(false);
  });

  it('an empty key disables signing, as the protocol says', () => {
    const signer = createSigner('');
    expect(signer.enabled).toBe(false);
    const frames = encodeMessage([], { header: { msg_id: 'a', msg_type: 'x', session: 's', username: 'u', date: 'd', version: '5.3' }, parent_header: {}, metadata: {}, content: {}, buffers: [] }, signer);
    expect(frames[1]!.length).toBe(0);
    expect(decodeMessage(frames, signer).ok).toBe(true);
  });

  it('refuses unknown signature schemes', () => {
    expect(() => createSigner(KEY, 'rot13')).toThrow(SignatureSchemeError);
    expect(() => createSigner(KEY, 'hmac-nosuchhash')).toThrow(SignatureSchemeError);
  });
});

describe('frames', () => {
  it('keeps identities, buffers and extra header fields', () => {
    const signer = createSigner(KEY);
    const message = {
      header: { msg_id: 'm', msg_type: 'comm_msg', session: 's', username: 'u', date: 'd', version: '5.4', subshell_id: null },
      parent_header: { msg_id: 'p' },
      metadata: { cellId: 'c1' },
      content: { comm_id: 'x', data: {}, future_field: [1, 2] },
      buffers: [Buffer.from([0, 1, 2, 255])],
    };
    const frames = encodeMessage([b('id-a'), b('id-b')], message, signer);
    const decoded = decodeMessage(frames, signer);
    expect(decoded.ok).toBe(true);
    if (!decoded.ok) return;
    expect(decoded.value.identities.map(String)).toEqual(['id-a', 'id-b']);
    expect(decoded.value.header).toEqual(message.header);
    expect(decoded.value.content).toEqual(message.content);
    expect(decoded.value.buffers[0]!.equals(message.buffers[0]!)).toBe(true);
  });

  it('names what is wrong with malformed frames', () => {
    const signer = createSigner('');
    expect(splitFrames([b('x')])).toEqual({ ok: false, reason: 'no <IDS|MSG> delimiter' });
    expect(splitFrames([DELIMITER, b(''), b('{}')]).ok).toBe(false);
    expect(decodeMessage([DELIMITER, b(''), b('nope'), b('{}'), b('{}'), b('{}')], signer)).toEqual({ ok: false, reason: 'header is not valid JSON' });
    expect(decodeMessage([DELIMITER, b(''), b('[]'), b('{}'), b('{}'), b('{}')], signer)).toEqual({ ok: false, reason: 'header is not a JSON object' });
    expect(decodeMessage([DELIMITER, b(''), b('{"msg_id":1}'), b('{}'), b('{}'), b('{}')], signer).ok).toBe(false);
    expect(decodeMessage([DELIMITER, b(''), b('{"msg_id":"a","msg_type":"x"}'), b('{}'), b('{}'), b('7')], signer)).toEqual({ ok: false, reason: 'content is not a JSON object' });
  });
});

describe('wire parser properties (fast-check)', () => {
  const signer = createSigner(KEY);
  const frame = fc.oneof(
    fc.uint8Array({ maxLength: 64 }).map((a) => Buffer.from(a)),
    fc.string({ maxLength: 40 }).map(b),
    fc.constant(DELIMITER),
    fc.json({ maxDepth: 3 }).map(b),
  );

  it('never throws on random frames, and never accepts an unsigned one', () => {
    fc.assert(
      fc.property(fc.array(frame, { maxLength: 10 }), (frames) => {
        const decoded = decodeMessage(frames, signer);
        // Random frames cannot carry a valid HMAC under the key.
        expect(decoded.ok).toBe(false);
      }),
      { numRuns: 500 },
    );
  });

  it('rejects any single-byte change to a signed frame', () => {
    const frames = encodeMessage([b('peer')], { header: { msg_id: 'm', msg_type: 'execute_request', session: 's', username: 'u', date: 'd', version: '5.3' }, parent_header: {}, metadata: {}, content: { code: 'say hi' }, buffers: [] }, signer);
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5 }), fc.nat(), fc.integer({ min: 1, max: 255 }), (which, at, xor) => {
        const mutated = frames.map((f) => Buffer.from(f));
        const target = mutated[1 + which]!; // signature or one of the four JSON frames
        if (target.length === 0) return;
        target[at % target.length]! ^= xor;
        expect(decodeMessage(mutated, signer).ok).toBe(false);
      }),
      { numRuns: 500 },
    );
  });

  it('round-trips any JSON content', () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 3 })), (content) => {
        const message = { header: { msg_id: 'm', msg_type: 't', session: 's', username: 'u', date: 'd', version: '5.3' }, parent_header: {}, metadata: {}, content, buffers: [] };
        const decoded = decodeMessage(encodeMessage([], message, signer), signer);
        expect(decoded.ok).toBe(true);
        if (decoded.ok) expect(decoded.value.content).toEqual(JSON.parse(JSON.stringify(content)));
      }),
      { numRuns: 300 },
    );
  });
});
