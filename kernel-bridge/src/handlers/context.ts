/**
 * What a message handler gets: the request, the session it drives, the kernel's own state, and ways to answer.
 * One handler per message type (see index.ts); the router wraps each call in busy → … → idle on IOPub.
 */
import type { CellOutput, CellSession } from '@multiplet/cells/protocol';
import type { CommRegistry } from '../comms';
import type { HistoryStore } from '../history';
import type { JsonObject, ReceivedMessage } from '../wire';

export type Channel = 'shell' | 'control';

/** Mutable kernel state owned by the router; handlers change it only through these fields. */
export interface KernelState {
  executionCount: number;
  readonly history: HistoryStore;
  readonly comms: CommRegistry;
}

export interface KernelIdentity {
  implementation: string;
  implementationVersion: string;
  helpLinks: { text: string; url: string }[];
}

export interface HandlerContext {
  readonly request: ReceivedMessage;
  readonly channel: Channel;
  readonly session: CellSession;
  readonly state: KernelState;
  readonly identity: KernelIdentity;
  /** Send the reply on the request's channel, back to its sender. */
  reply(msgType: string, content: JsonObject): Promise<void>;
  /** Publish on IOPub with the request as parent; resolves once sent (await it before blocking work). */
  publish(msgType: string, content: JsonObject, parent?: JsonObject): Promise<void>;
  /** Map a session output to its IOPub message, with the request as parent. */
  publishOutput(output: CellOutput, parent?: JsonObject): void;
  /**
   * Run cancellable session work: while `work` runs, interrupt requests set the flag it receives. At most one
   * such task runs at a time (they all come from the shell queue).
   */
  cancellable<T>(work: (cancelFlag: Int32Array) => Promise<T>): Promise<T>;
  /** Reply to every execute_request still waiting in the shell queue with status "aborted" (stop_on_error). */
  abortQueuedExecutes(): void;
  /** Header of the shell request being handled right now (the parent for comm messages the session sends). */
  currentShellParent(): JsonObject | undefined;
  /** Interrupt the running cancellable task, if any. */
  interrupt(): void;
  /** Ask the host to shut down once this request's idle status is out. */
  requestShutdown(restart: boolean): void;
  log(text: string): void;
}

export type Handler = (context: HandlerContext) => Promise<void>;

/** Reply content for a request the handler cannot serve (bad field types): status "error", nothing executed. */
export function invalidRequest(field: string, expected: string, given: unknown): JsonObject {
  const shown = given === undefined ? 'nothing' : JSON.stringify(given)?.slice(0, 80) ?? String(given);
  return { status: 'error', ename: 'InvalidRequest', evalue: `${field}: expected ${expected}, got ${shown}`, traceback: [] };
}

/** Reply content when the session itself failed while serving a request. */
export function sessionFailure(err: unknown): JsonObject {
  const evalue = err instanceof Error ? err.message : String(err);
  const ename = err instanceof Error ? err.name : 'Error';
  const traceback = err instanceof Error && err.stack ? err.stack.split('\n') : [evalue];
  return { status: 'error', ename, evalue, traceback };
}

export function isObject(value: unknown): value is JsonObject {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}
