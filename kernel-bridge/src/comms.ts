/**
 * Open comms: comm id → target name and the session's handler. The registry only keeps track; the comm
 * handlers (handlers/comm*.ts) decide what to do with messages.
 */
import type { ExecuteOptions } from '@multiplet/cells/protocol';
import type { JsonObject } from './wire';

export interface OpenComm {
  commId: string;
  targetName: string;
  handler: { onMessage(data: unknown, options: ExecuteOptions): Promise<void>; onClose(): void };
  /** Header of the latest request for this comm: the parent of what the session sends back on it. */
  parent: JsonObject;
}

export class CommRegistry {
  private readonly open = new Map<string, OpenComm>();

  has(commId: string): boolean {
    return this.open.has(commId);
  }

  get(commId: string): OpenComm | undefined {
    return this.open.get(commId);
  }

  add(comm: OpenComm): void {
    this.open.set(comm.commId, comm);
  }

  remove(commId: string): OpenComm | undefined {
    const comm = this.open.get(commId);
    this.open.delete(commId);
    return comm;
  }

  /** comm_info_reply's `comms`: id → { target_name }, optionally for one target. */
  info(targetName?: string): Record<string, { target_name: string }> {
    const comms: Record<string, { target_name: string }> = {};
    for (const c of this.open.values()) if (targetName === undefined || c.targetName === targetName) comms[c.commId] = { target_name: c.targetName };
    return comms;
  }

  /** Close every comm (kernel restart), telling each handler. */
  closeAll(onError: (commId: string, err: unknown) => void): void {
    for (const c of [...this.open.values()]) {
      this.open.delete(c.commId);
      try {
        c.handler.onClose();
      } catch (err) {
        onError(c.commId, err);
      }
    }
  }

  get size(): number {
    return this.open.size;
  }
}
