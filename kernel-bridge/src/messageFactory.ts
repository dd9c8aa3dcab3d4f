/**
 * Headers for the messages the kernel sends. One kernel session id per process; message ids are the session id
 * and a counter, so they are unique without randomness per message. The header `date` is the only wall-clock
 * value, and it stays in the transport: nothing here reaches the cells.
 */
import { randomUUID } from 'node:crypto';
import type { JsonObject, JupyterMessage, MessageHeader } from './wire';

/** The messaging protocol version this kernel speaks. */
export const PROTOCOL_VERSION = '5.3';

export interface MessageFactory {
  readonly session: string;
  header(msgType: string): MessageHeader;
  /** A message in reply to (or caused by) `parent`; pass `undefined` for a message without a parent. */
  message(msgType: string, content: JsonObject, parent: MessageHeader | JsonObject | undefined, metadata?: JsonObject): JupyterMessage;
}

export function createMessageFactory(options: { session?: string; username?: string; now?: () => Date } = {}): MessageFactory {
  const session = options.session ?? randomUUID();
  const username = options.username ?? 'multiplet';
  const now = options.now ?? (() => new Date());
  let counter = 0;
  const header = (msgType: string): MessageHeader => ({
    msg_id: `${session}_${++counter}`,
    msg_type: msgType,
    session,
    username,
    date: now().toISOString(),
    version: PROTOCOL_VERSION,
  });
  return {
    session,
    header,
    message: (msgType, content, parent, metadata = {}) => ({
      header: header(msgType),
      parent_header: parent ?? {},
      metadata,
      content,
      buffers: [],
    }),
  };
}
