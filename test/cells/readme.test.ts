// The "Adding a cell kind" example of packages/cells/README.md is real code: this file keeps a copy (imports
// rewritten to package paths), checks that the copy matches the README, registers it and runs it, with the live
// control it declares and its cross-field check.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { compile } from 'vega-lite';
import { registerKind, RESULT_MIME_TYPE, type ResultPayload } from '@multiplet/cells';
import { CURIE_PREFACTOR_EMU_K_PER_MOL } from '@multiplet/physics/units';
import { curieWeissKind } from './readmeExample';
import { createCellSession, run, runOk, errorOf, SAMPLE_CELL } from './helpers';

registerKind(curieWeissKind);

describe('README example kind', () => {
  it('is the code printed in the README', () => {
    const readme = readFileSync(new URL('../../packages/cells/README.md', import.meta.url), 'utf8');
    const block = /```ts\n(\/\/ packages\/cells\/src\/kinds\/curieWeiss.ts\n[\s\S]*?)```/.exec(readme)![1]!;
    const copy = readFileSync(new URL('./readmeExample.ts', import.meta.url), 'utf8');
    expect(copy).toBe(block.replace("'./types'", "'@multiplet/cells/kinds/types'").replace("'../render/format'", "'@multiplet/cells/render/format'"));
  });

  it('runs against the sample, renders a compilable plot and declares its slider', async () => {
    const s = createCellSession();
    await runOk(s, SAMPLE_CELL);
    const { data } = await runOk(s, '[curie-weiss] cw\ntemperatures: 10 K .. 300 K / 4\nthetaCW: -1 K\n');
    const payload = data[RESULT_MIME_TYPE] as ResultPayload & { result: { chiEmuPerMol: number[] } };
    // Dy3+: g_J² J(J+1) = (4/3)² · (15/2)(17/2) = 340/3 → C ≈ 14.17 emu K/mol (free ion; common practice).
    expect(payload.result.chiEmuPerMol[0]).toBeCloseTo((CURIE_PREFACTOR_EMU_K_PER_MOL * 340) / 3 / 11, 10);
    expect(payload.result.chiEmuPerMol[0]! * 11).toBeCloseTo(14.17, 2);
    expect(payload.controls).toEqual([{ field: 'thetaCW', label: 'thetaCW', unit: 'K', value: -1, min: -50, max: 50, step: 0.5 }]);
    expect(payload.provenance.reads).toEqual(['host']);
    compile(data['application/vnd.vegalite.v5+json'] as never);
    expect(errorOf(await run(s, '[curie-weiss] bad\ntemperatures: 1 K .. 3 K / 3\nthetaCW: 2 K\n')).evalue).toMatch(/^line 2, column 15: temperatures: got \[1,2,3\], expected T > θ_CW/);
    expect(() => registerKind(curieWeissKind)).toThrow(/already registered/);
  });
});
