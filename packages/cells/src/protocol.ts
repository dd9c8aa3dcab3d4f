/**
 * The contract between the cells executor and whatever hosts it (the ZeroMQ kernel in kernel-bridge/, the
 * in-process headless runner in packages/cli). Both hosts drive the same `CellSession`, so a notebook gives the
 * same outputs either way. Types only; the implementation is `createCellSession` in session.ts.
 */

/** A MIME bundle: mime type → data (string for text types, JSON value for JSON types). */
export type MimeBundle = Record<string, unknown>;

/** One output a running cell emits before it finishes (mirrors the Jupyter IOPub output messages). */
export type CellOutput =
  | { type: 'stream'; name: 'stdout' | 'stderr'; text: string }
  | { type: 'display_data'; data: MimeBundle; metadata: Record<string, unknown>; displayId?: string }
  | { type: 'update_display_data'; data: MimeBundle; metadata: Record<string, unknown>; displayId: string }
  | { type: 'clear_output'; wait: boolean };

export interface ExecuteOptions {
  /** Called for every intermediate output, in order. */
  emit(output: CellOutput): void;
  /** Cooperative cancellation: the host sets index 0 to 1 (Atomics.store) to interrupt; long work checks it. */
  cancelFlag?: Int32Array;
  /** Jupyter execution count of this request, recorded in result provenance. */
  executionCount?: number;
  /** Identifier of the notebook cell (nbformat cell id), when the host knows it. */
  cellId?: string;
}

export type ExecuteOutcome =
  | {
      status: 'ok';
      /**
       * The execute_result bundle, if the cell produced a value. Typed cells always return one, with a
       * `displayId` (added by the cells package, compatible extension): hosts send it as
       * `transient.display_id` of the execute_result so that later `update_display_data` messages (a rerun
       * after a live-control change, rerun-stale) replace it in place. Display ids are unique per session.
       */
      result?: { data: MimeBundle; metadata: Record<string, unknown>; displayId?: string };
    }
  | {
      status: 'error';
      ename: string;
      evalue: string;
      traceback: string[];
    };

export interface CompletionReply {
  matches: string[];
  cursorStart: number;
  cursorEnd: number;
  metadata?: Record<string, unknown>;
}

export interface InspectionReply {
  found: boolean;
  data: MimeBundle;
}

export type CompletenessReply = { status: 'complete' | 'incomplete' | 'invalid' | 'unknown'; indent?: string };

/** A comm channel opened by a front end (the JupyterLab extension's live controls, the state panel). */
export interface CommHost {
  send(data: unknown): void;
}

export interface CellSession {
  execute(code: string, options: ExecuteOptions): Promise<ExecuteOutcome>;
  complete(code: string, cursorPos: number): CompletionReply;
  inspect(code: string, cursorPos: number, detailLevel: number): InspectionReply;
  isComplete(code: string): CompletenessReply;
  /** Comm target names this session answers (e.g. "multiplet.controls", "multiplet.state"). */
  commTargets(): string[];
  /** A front end opened a comm; returns the handler for its messages, or undefined to refuse. */
  openComm(
    target: string,
    commId: string,
    data: unknown,
    host: CommHost,
  ): { onMessage(data: unknown, options: ExecuteOptions): Promise<void>; onClose(): void } | undefined;
  /** Language info for kernel_info_reply. */
  languageInfo(): { name: string; version: string; mimetype: string; file_extension: string; codemirror_mode?: unknown };
  /** Banner text for kernel_info_reply. */
  banner(): string;
  /** Forget everything (kernel restart). */
  reset(): void;
}
