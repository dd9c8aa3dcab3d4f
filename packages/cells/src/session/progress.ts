/**
 * A LongTask whose progress is one display output updated in place (display_data once, then
 * update_display_data), never a flood of stream lines. Intermediate updates are throttled by wall time; the final
 * text ("<label>: done") does not depend on timing, so executed notebooks are identical between hosts.
 */
import { createTask, type LongTask } from '@multiplet/physics/progress';
import type { CellOutput, MimeBundle } from '../protocol';

export interface ProgressTask extends LongTask {
  /** Mark the display finished (only if progress was shown). */
  finish(): void;
}

export function createProgressTask(label: string, displayId: string, emit: (o: CellOutput) => void, cancelFlag?: Int32Array): ProgressTask {
  let shown = false;
  let last = 0;
  const bundle = (done: number, total: number, phase?: string): MimeBundle => {
    const fraction = total > 0 ? Math.min(1, Math.max(0, done / total)) : 0;
    const bar = '#'.repeat(Math.round(fraction * 30)).padEnd(30, '.');
    return { 'text/plain': `${label}: [${bar}] ${Math.round(fraction * 100)}%${phase ? ` ${phase}` : ''}` };
  };
  const task = createTask((done, total, phase) => {
    const now = performance.now();
    if (!shown) {
      shown = true;
      last = now;
      emit({ type: 'display_data', data: bundle(done, total, phase), metadata: {}, displayId });
    } else if (now - last > 250) {
      last = now;
      emit({ type: 'update_display_data', data: bundle(done, total, phase), metadata: {}, displayId });
    }
  }, cancelFlag ?? new Int32Array(new SharedArrayBuffer(4)));
  return {
    report: (done, total, phase) => task.report(done, total, phase),
    checkpoint: () => task.checkpoint(),
    get cancelled() {
      return task.cancelled;
    },
    finish() {
      if (shown) emit({ type: 'update_display_data', data: { 'text/plain': `${label}: done` }, metadata: {}, displayId });
    },
  };
}
