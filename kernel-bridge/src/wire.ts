/**
 * The Jupyter wire format over ZeroMQ (Jupyter messaging specification, "The Wire Protocol"):
 *
 *   [identities…, "<IDS|MSG>", signature, header, parent_header, metadata, content, buffers…]
 *
 * Decoding never throws: every malformed input becomes a `WireRejection` with a reason for the log.
 * Unknown header fields and extra content fields are kept as they are (tolerated, not validated away).
 */
import type { Signer, SignedParts } from './signing';

export const DELIMITER = Buffer.from('<IDS|MSG>', 'ascii');

export type JsonObject = Record<string, unknown>;

export interface MessageHeader extends JsonObject {
  msg_id: string;
  msg_type: string;
  session: string;
  username: string;
  date: string;
  version: string;
}

/** A decoded message. `header` keeps every field the sender put there. */
export interface JupyterMessage {
  header: MessageHeader;
  parent_header: JsonObject;
  metadata: JsonObject;
  content: JsonObject;
  buffers: Buffer[];
}

/** A message received on a ROUTER socket: the routing identities come back on the reply. */
export interface ReceivedMessage extends JupyterMessage {
  identities: Buffer[];
  /** The signature frame as received (hex), for replay detection. */
  signature: string;
}

export type WireRejection = { ok: false; reason: string };
export type Decoded<T> = { ok: true; value: T } | WireRejection;

export interface SplitFrames {
  identities: Buffer[];
  signature: Buffer;
  parts: SignedParts;
  buffers: Buffer[];
}

/** Split raw frames at the delimiter. Pure framing; no JSON parsing, no signature check. */
export function splitFrames(frames: readonly Buffer[]): Decoded<SplitFrames> {
  const at = frames.findIndex((f) => f.equals(DELIMITER));
  if (at < 0) return { ok: false, reason: 'no <IDS|MSG> delimiter' };
  if (frames.length < at + 6) return { ok: false, reason: `expected at least 5 frames after the delimiter, got ${frames.length - at - 1}` };
  const [signature, header, parent, metadata, content] = frames.slice(at + 1, at + 6) as [Buffer, Buffer, Buffer, Buffer, Buffer];
  return {
    ok: true,
    value: {
      identities: frames.slice(0, at),
      signature,
      parts: [header, parent, metadata, content],
      buffers: frames.slice(at + 6),
    },
  };
}

function parseObject(frame: Buffer, name: string): Decoded<JsonObject> {
  let value: unknown;
  try {
    value = JSON.parse(frame.toString('utf8'));
  } catch {
    return { ok: false, reason: `${name} is not valid JSON` };
  }
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return { ok: false, reason: `${name} is not a JSON object` };
  return { ok: true, value: value as JsonObject };
}

/**
 * Frames → message: split, verify the signature (constant time), parse the four JSON frames and check the header
 * has a string msg_id and msg_type. The signature is checked before any JSON is parsed.
 */
export function decodeMessage(frames: readonly Buffer[], signer: Signer): Decoded<ReceivedMessage> {
  const split = splitFrames(frames);
  if (!split.ok) return split;
  const { identities, signature, parts, buffers } = split.value;
  if (!signer.verify(signature, parts)) return { ok: false, reason: signature.length === 0 ? 'missing signature' : 'bad signature' };
  const header = parseObject(parts[0], 'header');
  if (!header.ok) return header;
  const parent = parseObject(parts[1], 'parent_header');
  if (!parent.ok) return parent;
  const metadata = parseObject(parts[2], 'metadata');
  if (!metadata.ok) return metadata;
  const content = parseObject(parts[3], 'content');
  if (!content.ok) return content;
  const h = header.value;
  if (typeof h.msg_id !== 'string' || typeof h.msg_type !== 'string' || h.msg_type === '') {
    return { ok: false, reason: 'header lacks a string msg_id and msg_type' };
  }
  return {
    ok: true,
    value: {
      identities,
      signature: signature.toString('latin1'),
      header: h as MessageHeader,
      parent_header: parent.value,
      metadata: metadata.value,
      content: content.value,
      buffers,
    },
  };
}

/** Message → frames, signed. `identities` are the ROUTER routing ids (empty for PUB). */
export function encodeMessage(identities: readonly Buffer[], message: JupyterMessage, signer: Signer): Buffer[] {
  const parts: SignedParts = [
    Buffer.from(JSON.stringify(message.header), 'utf8'),
    Buffer.from(JSON.stringify(message.parent_header), 'utf8'),
    Buffer.from(JSON.stringify(message.metadata), 'utf8'),
    Buffer.from(JSON.stringify(message.content), 'utf8'),
  ];
  return [...identities, DELIMITER, Buffer.from(signer.sign(parts), 'ascii'), ...parts, ...message.buffers];
}
