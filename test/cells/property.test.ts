// Property-based checks (fast-check): random and malformed cell text and unit strings never crash or hang the
// session, always give a clear positioned message, and leave the serialized state byte-for-byte unchanged.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseQuantity, parseRange, CONTROLS_TARGET, STATE_TARGET } from '@multiplet/cells';
import { createCellSession, run, runOk, SAMPLE_CELL, CEF_CELL } from './helpers';

const kinds = fc.constantFrom('sample', 'data', 'crystal-field', 'nosuch', 'Sample', '');
const fieldNames = fc.constantFrom('compound', 'ion', 'siteSymmetry', 'latticeConstant', 'molarMass', 'ionsPerFormulaUnit', 'B', 'B20', 'table', 'file', 'unit', 'seed', 'x');
const scalar = fc.oneof(
  fc.string({ maxLength: 12 }),
  fc.double({ noNaN: false }).map(String),
  fc.constantFrom('4.2 K', '0.35 meV', '12 cm^-1', '-1 T', 'Dy3+', 'D3d', '[1, 2', '{a: }', '|', '&a', '*a', '!!binary x', '"unterminated', '1 .. 2 / 3', 'null', '~', '1e999 K'),
);
const line = fc.oneof(
  fc.tuple(fc.nat(4), fieldNames, scalar).map(([indent, key, value]) => `${' '.repeat(indent)}${key}: ${value}`),
  fc.string({ maxLength: 20 }),
  fc.constantFrom('B:', '  B20: -0.3 meV', 'table: |', '  T (K), C (J/mol/K)', '  1, 2', '- a', '---', '...', '\t'),
);
const typedCell = fc.tuple(kinds, fc.constantFrom('r', 'host', 'cefA', '1x', ''), fc.array(line, { maxLength: 8 })).map(
  ([kind, name, lines]) => [`[${kind}] ${name}`, ...lines].join('\n'),
);

describe('malformed cells (fast-check)', () => {
  it('typed cells: an ok result or a clear error, and the state unchanged on error', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    await fc.assert(
      fc.asyncProperty(typedCell, async (cell) => {
        const before = s.state.serialize();
        const r = await run(s, cell);
        if (r.outcome.status === 'error') {
          expect(r.outcome.evalue.length).toBeGreaterThan(10);
          expect(r.outcome.ename).toMatch(/^(Cell(Syntax|Input|Reference|Run)Error|ScriptError)$/);
          expect(r.outcome.evalue).not.toMatch(/got NaN\b|undefined|\[object Object\]|internal error|the computation failed/);
          expect(s.state.serialize()).toBe(before);
        }
      }),
      { numRuns: 250, seed: 20261202 },
    );
  });

  it('arbitrary text starting with "[" never throws out of execute', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await fc.assert(
      fc.asyncProperty(fc.string({ maxLength: 80 }), async (text) => {
        const before = s.state.serialize();
        const r = await run(s, `[${text}`);
        if (r.outcome.status === 'error') expect(s.state.serialize()).toBe(before);
      }),
      { numRuns: 200, seed: 7 },
    );
  });

  it('unit strings: a number or a clear refusal, never a crash', () => {
    const unitText = fc.oneof(
      fc.string({ maxLength: 15 }),
      fc.tuple(fc.double(), fc.constantFrom('K', 'meV', 'cm^-1', 'T', 'angstrom', 'g/mol', 'furlong', 'K^2', 'm/s', '', ' ', '1/K', 'degC')).map(([v, u]) => `${v} ${u}`),
    );
    fc.assert(
      fc.property(unitText, fc.constantFrom('K', 'meV', 'T', 'angstrom', 'g/mol', ''), (text, target) => {
        try {
          const value = parseQuantity(text, target);
          expect(Number.isFinite(value)).toBe(true);
        } catch (problem) {
          expect((problem as Error).message).toMatch(/^expected /);
        }
        try {
          const scan = parseRange(`${text} .. ${text} / 3`, target || 'K');
          expect(scan.values.every(Number.isFinite)).toBe(true);
        } catch (problem) {
          expect((problem as Error).message).toMatch(/^expected /);
        }
      }),
      { numRuns: 500, seed: 42 },
    );
  });

  it('random quantities inside a sample cell: ok or positioned error, state unchanged', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    await fc.assert(
      fc.asyncProperty(fc.string({ maxLength: 20 }), async (text) => {
        const before = s.state.serialize();
        const r = await run(s, `[sample] other\ncompound: X\nion: Ho\nlatticeConstant: ${JSON.stringify(text)}\n`);
        if (r.outcome.status === 'error') {
          expect(r.outcome.evalue).toMatch(/^line \d+, column \d+: /);
          expect(s.state.serialize()).toBe(before);
        }
      }),
      { numRuns: 150, seed: 3 },
    );
  });

  it('random comm messages: every one answered, the state unchanged unless a valid set', async () => {
    const s = createCellSession({ notebookDir: mkdtempSync(join(tmpdir(), 'multiplet-prop-')) });
    await runOk(s, SAMPLE_CELL);
    await runOk(s, CEF_CELL);
    const sent: unknown[] = [];
    const controls = s.openComm(CONTROLS_TARGET, 'c1', {}, { send: (d) => sent.push(d) })!;
    const stateComm = s.openComm(STATE_TARGET, 'c2', {}, { send: (d) => sent.push(d) })!;
    const value = fc.oneof(fc.double(), fc.string({ maxLength: 12 }), fc.constantFrom('-0.3 meV', '1e3 K', 'none', 'D3'), fc.constant(null), fc.object({ maxDepth: 1 }));
    const message = fc.record(
      {
        action: fc.constantFrom('set', 'writeback', 'snapshot', 'rerun-stale', 'load', 'bogus', ''),
        result: fc.constantFrom('host', 'cefA', 'nope', ''),
        field: fc.constantFrom('B.B20', 'B.B22', 'siteSymmetry', 'compound', 'ion', '', 'B', 'x.y.z'),
        value,
        path: fc.string({ maxLength: 10 }).map((p) => `missing-${p.replace(/[^a-z]/g, '')}.json`),
      },
      { requiredKeys: [] },
    );
    await fc.assert(
      fc.asyncProperty(fc.boolean(), fc.oneof(message, fc.anything()), async (useControls, data) => {
        const before = s.state.serialize();
        const count = sent.length;
        await (useControls ? controls : stateComm).onMessage(data, { emit: () => {} });
        expect(sent.length).toBeGreaterThan(count);
        const reply = sent.at(-1) as { action: string; message?: string };
        if (reply.action === 'error') {
          expect(reply.message!.length).toBeGreaterThan(5);
          expect(s.state.serialize()).toBe(before);
        }
      }),
      { numRuns: 200, seed: 11 },
    );
  });
});
