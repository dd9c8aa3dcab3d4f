/**
 * Live controls of a result: one labelled slider plus number field per free input of the cell (the B_n^m of a
 * crystal-field cell, a temperature, a field). Moving one asks the kernel, through a `ControlChannel`, to rerun the
 * owning cell and its dependants; the notebook cell text changes only when the user asks ("Write into cell").
 */
import { Widget } from '@lumino/widgets';
import type { ResultControl, ResultPayload } from './protocol';

/** How a control reaches the kernel and the notebook; implemented by `NotebookLinks` (links.ts). */
export interface ControlChannel {
  /** Send a new value; resolves when the kernel has accepted it. `origin` is a node inside the output. */
  setControl(origin: HTMLElement, result: ResultPayload, control: ResultControl, value: number): Promise<void>;
  /** Put the cell text the kernel ran last for `result` (with the control values in it) into the notebook cell. */
  writeIntoCell(origin: HTMLElement, result: ResultPayload): Promise<void>;
}

/** Short display of a number that keeps significant digits and drops trailing zeros. */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e5 || magnitude < 1e-4) return value.toExponential(4).replace(/\.?0+e/, 'e');
  return String(Number(value.toPrecision(6)));
}

let nextControlId = 0;

/** Delay between the last movement and the message to the kernel, so a drag sends one message, not fifty. */
const SEND_DELAY_MS = 150;

export class ControlsView extends Widget {
  constructor(channel: ControlChannel) {
    super();
    this._channel = channel;
    this.addClass('jp-Multiplet-controls');
    this.node.setAttribute('role', 'group');
    this.node.setAttribute('aria-label', 'Live controls');
  }

  /** Show the controls of `result`; keeps the existing inputs (and keyboard focus) when only values changed. */
  showResult(result: ResultPayload): void {
    const sameShape =
      this._result !== null &&
      this._result.controls.length === result.controls.length &&
      this._result.controls.every((c, i) => c.field === result.controls[i].field);
    this._result = result;
    this.setHidden(result.controls.length === 0);
    if (!sameShape) {
      this._build(result);
      return;
    }
    for (const control of result.controls) {
      const row = this._rowFor(control.field);
      if (!row) continue;
      row.classList.remove('jp-mod-pending');
      if (this._pending.has(control.field)) continue;
      // The kernel re-centres the range on the new value; keep the same input element so focus stays.
      const slider = row.querySelector<HTMLInputElement>('.jp-Multiplet-controlSlider');
      if (slider) Object.assign(slider, { min: String(control.min), max: String(control.max), step: String(control.step) });
      this._showValue(row, control, control.value, true);
    }
  }

  handleEvent(event: Event): void {
    const target = event.target as HTMLElement;
    if (event.type === 'click' && target.closest('.jp-Multiplet-writeBack') && this._result) {
      this._writeBack(this._result);
      return;
    }
    const row = target.closest<HTMLElement>('.jp-Multiplet-control');
    const control = row ? this._controlFor(row.dataset.field ?? '') : undefined;
    if (!row || !control || !this._result) return;
    if (event.type === 'input' && target instanceof HTMLInputElement && target.type === 'range') {
      this._showValue(row, control, Number(target.value), false);
    } else if (event.type === 'change' && target instanceof HTMLInputElement) {
      const value = Number(target.value);
      if (!Number.isFinite(value) || target.value.trim() === '') return;
      this._showValue(row, control, value, target.type !== 'range');
      this._scheduleSend(row, control, value);
    }
  }

  protected override onAfterAttach(): void {
    this.node.addEventListener('input', this);
    this.node.addEventListener('change', this);
    this.node.addEventListener('click', this);
  }

  protected override onBeforeDetach(): void {
    this.node.removeEventListener('input', this);
    this.node.removeEventListener('change', this);
    this.node.removeEventListener('click', this);
  }

  override dispose(): void {
    for (const timer of this._pending.values()) window.clearTimeout(timer);
    this._pending.clear();
    super.dispose();
  }

  private _scheduleSend(row: HTMLElement, control: ResultControl, value: number): void {
    const previous = this._pending.get(control.field);
    if (previous !== undefined) window.clearTimeout(previous);
    row.classList.add('jp-mod-pending');
    const result = this._result;
    this._pending.set(
      control.field,
      window.setTimeout(() => {
        this._pending.delete(control.field);
        if (!result) return;
        const status = row.querySelector('.jp-Multiplet-controlStatus');
        if (status) status.textContent = '';
        this._channel.setControl(this.node, result, control, value).catch((reason: unknown) => {
          row.classList.remove('jp-mod-pending');
          if (status) status.textContent = reason instanceof Error ? reason.message : String(reason);
        });
      }, SEND_DELAY_MS),
    );
  }

  private _writeBack(result: ResultPayload): void {
    const status = this.node.querySelector('.jp-Multiplet-writeBackStatus');
    this._channel.writeIntoCell(this.node, result).then(
      () => {
        this.node.classList.remove('jp-mod-writeFailed');
        if (status) status.textContent = 'The cell text now holds these values.';
      },
      (reason: unknown) => {
        this.node.classList.add('jp-mod-writeFailed');
        if (status) status.textContent = reason instanceof Error ? reason.message : String(reason);
      },
    );
  }

  private _build(result: ResultPayload): void {
    this.node.textContent = '';
    for (const control of result.controls) {
      const id = `jp-Multiplet-control-${nextControlId++}`;
      const { min, max, step } = control;
      const row = document.createElement('div');
      row.className = 'jp-Multiplet-control';
      row.dataset.field = control.field;

      const label = document.createElement('label');
      label.className = 'jp-Multiplet-controlLabel';
      label.htmlFor = id;
      label.textContent = control.label + (control.unit ? ` (${control.unit})` : '');

      const slider = document.createElement('input');
      slider.type = 'range';
      slider.id = id;
      slider.className = 'jp-Multiplet-controlSlider';
      slider.min = String(min);
      slider.max = String(max);
      slider.step = String(step);

      const number = document.createElement('input');
      number.type = 'number';
      number.className = 'jp-Multiplet-controlNumber';
      number.step = 'any';
      number.setAttribute('aria-label', `${control.label} value${control.unit ? ` in ${control.unit}` : ''}`);

      const status = document.createElement('span');
      status.className = 'jp-Multiplet-controlStatus';
      status.setAttribute('aria-live', 'polite');

      row.append(label, slider, number, status);
      this.node.appendChild(row);
      this._showValue(row, control, control.value, true);
    }
    const footer = document.createElement('div');
    footer.className = 'jp-Multiplet-controlsFooter';
    const writeBack = document.createElement('button');
    writeBack.type = 'button';
    writeBack.className = 'jp-Multiplet-writeBack jp-mod-styled';
    writeBack.textContent = 'Write values into cell';
    writeBack.title = `Replace the text of the ${result.name} cell with the text the kernel last ran (the values above)`;
    const status = document.createElement('span');
    status.className = 'jp-Multiplet-writeBackStatus';
    status.setAttribute('aria-live', 'polite');
    footer.append(writeBack, status);
    this.node.appendChild(footer);
  }

  private _showValue(row: HTMLElement, control: ResultControl, value: number, moveSlider: boolean): void {
    const slider = row.querySelector<HTMLInputElement>('.jp-Multiplet-controlSlider');
    const number = row.querySelector<HTMLInputElement>('.jp-Multiplet-controlNumber');
    if (slider && moveSlider) slider.value = String(value);
    if (slider) slider.setAttribute('aria-valuetext', `${formatNumber(value)}${control.unit ? ' ' + control.unit : ''}`);
    if (number && document.activeElement !== number) number.value = formatNumber(value);
  }

  private _rowFor(field: string): HTMLElement | null {
    return Array.from(this.node.querySelectorAll<HTMLElement>('.jp-Multiplet-control')).find((r) => r.dataset.field === field) ?? null;
  }

  private _controlFor(field: string): ResultControl | undefined {
    return this._result?.controls.find((c) => c.field === field);
  }

  private _channel: ControlChannel;
  private _result: ResultPayload | null = null;
  private _pending = new Map<string, number>();
}
