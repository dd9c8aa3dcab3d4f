/**
 * One pending send per socket: zeromq.js rejects a second concurrent send with EBUSY ("Socket is busy writing"),
 * so every send on a socket waits for the previous one. A failed send does not block the ones after it.
 */
export class SendQueue {
  private tail: Promise<void> = Promise.resolve();

  constructor(private readonly sendNow: (frames: Buffer[]) => Promise<void>) {}

  send(frames: Buffer[]): Promise<void> {
    const result = this.tail.then(() => this.sendNow(frames));
    this.tail = result.catch(() => undefined);
    return result;
  }

  /** Resolves once everything queued so far has been sent or has failed. */
  flushed(): Promise<void> {
    return this.tail;
  }
}
