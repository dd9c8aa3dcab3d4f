/**
 * execute_request: execute_input → the session's outputs → execute_result or one error → execute_reply.
 *
 * - `silent` runs the code without broadcasting anything on IOPub and without counting it (implies no history).
 * - `store_history` (default true) advances the execution count and records the input in history.
 * - `stop_on_error` (default true) makes an error abort every execute_request already queued behind this one.
 * - An interrupt (control interrupt_request or SIGINT) sets the cancel flag passed to the session; the session's
 *   error outcome becomes the reply.
 */
import type { CellOutput, ExecuteOutcome } from '@multiplet/cells/protocol';
import { invalidRequest, type Handler } from './context';

export const execute: Handler = async (ctx) => {
  const content = ctx.request.content;
  if (typeof content.code !== 'string') {
    await ctx.reply('execute_reply', { ...invalidRequest('code', 'a string', content.code), execution_count: ctx.state.executionCount });
    return;
  }
  const code = content.code;
  const silent = content.silent === true;
  const storeHistory = !silent && content.store_history !== false;
  const stopOnError = content.stop_on_error !== false;
  const cellId = typeof ctx.request.metadata.cellId === 'string' ? ctx.request.metadata.cellId : undefined;

  if (storeHistory) ctx.state.executionCount += 1;
  const executionCount = ctx.state.executionCount;
  // Wait until busy and execute_input are on the wire: a cell that blocks the thread must not hold them back.
  if (!silent) await ctx.publish('execute_input', { code, execution_count: executionCount });

  let finished = false;
  const emit = (output: CellOutput) => {
    if (finished) {
      ctx.log(`execute: dropped a ${output.type} output emitted after the cell finished`);
      return;
    }
    if (!silent) ctx.publishOutput(output);
  };

  let outcome: ExecuteOutcome;
  try {
    outcome = await ctx.cancellable((cancelFlag) =>
      ctx.session.execute(code, { emit, cancelFlag, executionCount, ...(cellId !== undefined ? { cellId } : {}) }),
    );
  } catch (err) {
    // The session is meant to turn every failure into an error outcome; this is the safety net.
    outcome = {
      status: 'error',
      ename: err instanceof Error ? err.name : 'Error',
      evalue: err instanceof Error ? err.message : String(err),
      traceback: err instanceof Error && err.stack ? err.stack.split('\n') : [String(err)],
    };
  }
  finished = true;

  if (outcome.status === 'ok') {
    if (outcome.result && !silent) {
      const { data, metadata, displayId } = outcome.result;
      // A display id lets later update_display_data messages (reruns after a control change) replace the result.
      ctx.publish('execute_result', { execution_count: executionCount, data, metadata, transient: displayId !== undefined ? { display_id: displayId } : {} });
    }
    if (storeHistory) {
      const plain = outcome.result?.data['text/plain'];
      ctx.state.history.record({ line: executionCount, input: code, output: typeof plain === 'string' ? plain : null });
    }
    await ctx.reply('execute_reply', { status: 'ok', execution_count: executionCount, payload: [], user_expressions: {} });
    return;
  }

  const error = { ename: outcome.ename, evalue: outcome.evalue, traceback: outcome.traceback };
  if (!silent) ctx.publish('error', error);
  if (storeHistory) ctx.state.history.record({ line: executionCount, input: code, output: null });
  if (stopOnError) ctx.abortQueuedExecutes();
  await ctx.reply('execute_reply', { status: 'error', ...error, execution_count: executionCount });
};
