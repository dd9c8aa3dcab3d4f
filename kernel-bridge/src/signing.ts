/**
 * HMAC signing of Jupyter wire messages.
 *
 * The signature is the hex HMAC of the four JSON frames (header, parent_header, metadata, content) exactly as they
 * travel on the wire, in that order; buffers are not signed (Jupyter messaging specification, "The Wire Protocol").
 * Incoming signatures are compared in constant time, and a bounded memory of recent signatures rejects replays
 * (the reference Python client keeps the same kind of digest history).
 */
import { createHmac, getHashes, timingSafeEqual } from 'node:crypto';

export type SignedParts = readonly [Buffer, Buffer, Buffer, Buffer];

export interface Signer {
  /** False when the connection file gave an empty key: the protocol then disables signing. */
  readonly enabled: boolean;
  /** Hex signature of the four JSON frames ("" when signing is disabled). */
  sign(parts: SignedParts): string;
  /** Constant-time check of a received signature; false for a wrong, malformed or missing one. */
  verify(signature: Buffer, parts: SignedParts): boolean;
}

export class SignatureSchemeError extends Error {
  constructor(readonly scheme: string) {
    super(`unsupported signature_scheme "${scheme}", expected "hmac-<hash>" such as "hmac-sha256"`);
    this.name = 'SignatureSchemeError';
  }
}

/** Build a signer from the connection file's `key` and `signature_scheme` (default "hmac-sha256"). */
export function createSigner(key: string, scheme = 'hmac-sha256'): Signer {
  const match = /^hmac-([a-z0-9-]+)$/i.exec(scheme);
  const algorithm = match?.[1]?.toLowerCase();
  if (!algorithm || !getHashes().includes(algorithm)) throw new SignatureSchemeError(scheme);
  const keyBytes = Buffer.from(key, 'utf8');
  const enabled = keyBytes.length > 0;

  const digest = (parts: SignedParts): Buffer => {
    const hmac = createHmac(algorithm, keyBytes);
    for (const part of parts) hmac.update(part);
    return hmac.digest();
  };

  return {
    enabled,
    sign(parts) {
      return enabled ? digest(parts).toString('hex') : '';
    },
    verify(signature, parts) {
      if (!enabled) return true;
      const expected = Buffer.from(digest(parts).toString('hex'), 'ascii');
      // timingSafeEqual needs equal lengths; the length of a hex digest is public, so checking it first leaks nothing.
      if (signature.length !== expected.length) return false;
      return timingSafeEqual(signature, expected);
    },
  };
}

/** Remembers recently seen signatures so that a captured message cannot be replayed. */
export class ReplayGuard {
  private readonly seen = new Set<string>();
  constructor(private readonly capacity = 1 << 16) {}

  /** True the first time a signature is offered, false for a repeat. Empty signatures are not tracked. */
  accept(signature: string): boolean {
    if (signature === '') return true;
    if (this.seen.has(signature)) return false;
    this.seen.add(signature);
    if (this.seen.size > this.capacity) {
      // Sets iterate in insertion order: drop the oldest tenth.
      let drop = Math.ceil(this.capacity / 10);
      for (const old of this.seen) {
        if (drop-- <= 0) break;
        this.seen.delete(old);
      }
    }
    return true;
  }
}
