/** An in-memory harness around KernelRouter: signed requests in, decoded sends out (no sockets). */
import { createMessageFactory, createSigner, decodeMessage, encodeMessage, KernelRouter, KERNEL_IDENTITY, type SocketName } from '@multiplet/kernel-bridge';
import type { JupyterMessage } from '@multiplet/kernel-bridge';
import type { CellSession } from '@multiplet/cells/protocol';
import { createSessionDouble, type SessionDouble } from './sessionDouble';

export const TEST_KEY = 'router-test-key';

export interface Sent {
  socket: SocketName;
  identities: string[];
  message: JupyterMessage;
}

export interface Harness<S extends CellSession = SessionDouble> {
  router: KernelRouter;
  session: S;
  sent: Sent[];
  logs: string[];
  shutdowns: boolean[];
  /** Sign and deliver a request; returns its msg_id. */
  request(socket: 'shell' | 'control' | 'stdin', msgType: string, content: Record<string, unknown>, metadata?: Record<string, unknown>): string;
  /** Sends parented to one request, in order. */
  forRequest(msgId: string): Sent[];
}

export function createHarness(): Harness;
export function createHarness<S extends CellSession>(session: S): Harness<S>;
export function createHarness(given?: CellSession): Harness<CellSession> {
  const signer = createSigner(TEST_KEY);
  const client = createMessageFactory({ session: 'client', username: 'tester' });
  const session = given ?? createSessionDouble();
  const sent: Sent[] = [];
  const logs: string[] = [];
  const shutdowns: boolean[] = [];
  const router = new KernelRouter({
    session,
    signer,
    factory: createMessageFactory({ session: 'kernel' }),
    identity: KERNEL_IDENTITY,
    send: async (socket, frames) => {
      const decoded = decodeMessage(frames, signer);
      if (!decoded.ok) throw new Error(`kernel sent an undecodable message: ${decoded.reason}`);
      sent.push({ socket, identities: decoded.value.identities.map(String), message: decoded.value });
    },
    log: (text) => logs.push(text),
    onShutdown: (restart) => shutdowns.push(restart),
  });
  return {
    router,
    session,
    sent,
    logs,
    shutdowns,
    request(socket, msgType, content, metadata = {}) {
      const message = client.message(msgType, content, undefined, metadata);
      router.receive(socket, encodeMessage([Buffer.from('peer-1')], message, signer));
      return message.header.msg_id;
    },
    forRequest: (msgId) => sent.filter((s) => s.message.parent_header.msg_id === msgId),
  };
}

/** "iopub:status:busy", "shell:execute_reply", … for compact ordering assertions. */
export function describeSent(list: Sent[]): string[] {
  return list.map((s) => {
    const type = s.message.header.msg_type;
    const extra = type === 'status' ? `:${String(s.message.content.execution_state)}` : '';
    return `${s.socket}:${type}${extra}`;
  });
}
