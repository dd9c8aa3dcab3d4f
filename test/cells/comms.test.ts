import { describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CONTROLS_TARGET, STATE_TARGET, RESULT_MIME_TYPE, setFieldInSource, type CellOutput, type ResultPayload } from '@multiplet/cells';
import { createCellSession, runOk, SAMPLE_CELL, CEF_CELL } from './helpers';

function openComm(session: ReturnType<typeof createCellSession>, target: string) {
  const sent: Record<string, unknown>[] = [];
  const handler = session.openComm(target, 'comm-1', {}, { send: (d) => sent.push(d as Record<string, unknown>) });
  if (!handler) throw new Error(`comm ${target} refused`);
  return { sent, handler };
}

describe('write-back', () => {
  it('replaces one value and keeps comments and layout', () => {
    const cell = '[crystal-field] c\n# from the fit\nB:\n  B20: -0.35 meV   # axial\n  B40: {x: 1}\n';
    expect(setFieldInSource(cell, 'B.B20', '-0.4 meV')).toBe('[crystal-field] c\n# from the fit\nB:\n  B20: -0.4 meV   # axial\n  B40: {x: 1}\n');
    expect(setFieldInSource('[sample] h\ncompound: X\n', 'molarMass', '5 g/mol')).toBe('[sample] h\ncompound: X\nmolarMass: 5 g/mol\n');
    expect(setFieldInSource('[crystal-field] c\nB:\n  B20: 1 meV\n', 'B.B40', '2 meV')).toBe('[crystal-field] c\nB:\n  B20: 1 meV\n  B40: 2 meV\n');
    expect(setFieldInSource('[crystal-field] c\nB: {B20: 1 meV}\n', 'B.B40', '2 meV')).toBe('[crystal-field] c\nB: {B20: 1 meV, B40: 2 meV}\n');
  });
});

describe('multiplet.controls', () => {
  it('set reruns the cell and its dependants, updates displays in place and replies with the new text', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const cef = await runOk(s, CEF_CELL);
    const cefDisplay = cef.outcome.status === 'ok' ? cef.outcome.result!.displayId : '';
    const { sent, handler } = openComm(s, CONTROLS_TARGET);
    const outputs: CellOutput[] = [];
    await handler.onMessage({ action: 'set', result: 'cefA', field: 'B.B20', value: -0.4 }, { emit: (o) => outputs.push(o) });
    expect(sent[0]).toMatchObject({ action: 'updated', result: 'cefA', field: 'B.B20', results: [{ name: 'cefA', status: 'ok' }] });
    expect(sent[0]!.source).toBe(CEF_CELL.replace('-0.35 meV', '-0.4 meV'));
    const update = outputs.find((o) => o.type === 'update_display_data');
    expect(update).toMatchObject({ type: 'update_display_data', displayId: cefDisplay });
    expect(((update as { data: Record<string, unknown> }).data[RESULT_MIME_TYPE] as ResultPayload).inputs).toMatchObject({ B: { B20: -0.4 } });
    expect(s.state.get('cefA')!.source).toBe(sent[0]!.source);

    await handler.onMessage({ action: 'writeback', result: 'cefA' }, { emit: () => {} });
    expect(sent[1]).toEqual({ action: 'writeback', result: 'cefA', source: sent[0]!.source, cellId: null });
  });

  it('changing the sample through a control reruns the dependent crystal field', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    const { sent, handler } = openComm(s, CONTROLS_TARGET);
    await handler.onMessage({ action: 'set', result: 'host', field: 'siteSymmetry', value: 'none' }, { emit: () => {} });
    expect(sent[0]).toMatchObject({ action: 'updated', results: [{ name: 'host', status: 'ok' }, { name: 'cefA', status: 'ok' }] });
    expect(s.state.get('cefA')!.stale).toBe(false);
  });

  it('bad messages get an error reply and change nothing', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    const before = s.state.serialize();
    const { sent, handler } = openComm(s, CONTROLS_TARGET);
    const bad: unknown[] = [
      null,
      { action: 'explode' },
      { action: 'set', result: 'nope', field: 'B.B20', value: 1 },
      { action: 'set', result: 'cefA', field: 'B.B20', value: 'x: y' },
      { action: 'set', result: 'cefA', field: 'compound', value: 3 },
      { action: 'set', result: 'cefA', field: 'B.B20', value: '0.3 furlong' },
      { action: 'set', result: 'cefA', field: 'B.B22', value: '0.3 meV' },
    ];
    for (const message of bad) await handler.onMessage(message, { emit: () => {} });
    expect(sent.map((m) => m.action)).toEqual(bad.map(() => 'error'));
    expect(String(sent[6]!.message)).toMatch(/B.B22: got 0.3, expected no B22 term in D3d/);
    expect(s.state.serialize()).toBe(before);
  });
});

describe('multiplet.state', () => {
  it('snapshot, pushed snapshots, rerun-stale, save and load', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'multiplet-comm-'));
    const s = createCellSession({ notebookDir: dir });
    const { sent, handler } = openComm(s, STATE_TARGET);
    await s.execute(SAMPLE_CELL, { emit: () => {}, cellId: 'abc-1', executionCount: 1 });
    expect(sent.at(-1)).toMatchObject({
      action: 'snapshot',
      sample: { name: 'host', ion: 'Dy3+' },
      results: [{ name: 'host', kind: 'sample', stale: false, executionCount: 1, cellId: 'abc-1' }],
    });
    await runOk(s, CEF_CELL);
    await runOk(s, '[data] cp\ntable: |\n  T (K), C (J/mol/K)\n  2, 0.5\n');
    await runOk(s, SAMPLE_CELL.replace('D3d', 'D3'));
    await handler.onMessage({ action: 'snapshot' }, { emit: () => {} });
    expect(sent.at(-1)).toMatchObject({
      action: 'snapshot',
      datasets: [{ name: 'cp', rows: 1, columns: [{ name: 'T', unit: 'K' }, { name: 'C', unit: 'J/mol/K' }] }],
      results: [{ name: 'host' }, { name: 'cefA', stale: true, reads: ['host'] }, { name: 'cp', stale: false }],
    });
    await handler.onMessage({ action: 'rerun-stale' }, { emit: () => {} });
    expect(sent.find((m) => m.action === 'rerun-stale')).toEqual({ action: 'rerun-stale', results: [{ name: 'cefA', status: 'ok' }] });
    await handler.onMessage({ action: 'save', path: 'state.json' }, { emit: () => {} });
    expect(sent.at(-1)).toEqual({ action: 'saved', path: join(dir, 'state.json') });
    const saved = s.state.serialize();
    s.reset();
    await handler.onMessage({ action: 'load', path: 'state.json' }, { emit: () => {} });
    expect(s.state.serialize()).toBe(saved);
    await handler.onMessage({ action: 'load', path: 'missing.json' }, { emit: () => {} });
    expect(sent.at(-1)).toMatchObject({ action: 'error' });
    expect(s.state.serialize()).toBe(saved);
    expect(s.openComm('other.target', 'x', {}, { send: () => {} })).toBeUndefined();
  });
});
