// The standalone notebook page in headless chromium, on the real Multiplet kernel: run a notebook, see the result
// views (level diagram; the neutron spectrum and powder magnetization that depend on it), move a B_n^m control, watch the sample-state panel mark and clear stale results, insert
// a template from the command palette, run it, break it, and read the precise error. Screenshots of each step go
// to test-artifacts/lab/; the one with the interactive crystal-field cell is copied to docs/screenshot-lab.png when
// MULTIPLET_UPDATE_DOCS=1.
import assert from 'node:assert/strict';
import { copyFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { after, before, test } from 'node:test';
import { openBrowser } from './browser.mjs';
import { repoRoot, startLab } from './server.mjs';

const artifacts = join(repoRoot, 'test-artifacts/lab');
mkdirSync(artifacts, { recursive: true });

let lab;
let browser;
let page;

const cefOutput = '.jp-Multiplet-result[data-kind="crystal-field"][data-result-name="cefA"]';
const spectrumOutput = '.jp-Multiplet-result[data-kind="neutron-spectrum"][data-result-name="spectrumA"]';
const magnetOutput = '.jp-Multiplet-result[data-kind="magnetization"][data-result-name="magnetA"]';
const stateResult = (name) => `.jp-Multiplet-statePanel li.jp-Multiplet-stateResult[data-name="${name}"]`;
const errorOutputs = '.jp-OutputArea-output[data-mime-type="application/vnd.jupyter.stderr"], .jp-RenderedText[data-mime-type="application/vnd.jupyter.stderr"]';

async function shot(name) {
  const path = join(artifacts, `${name}.png`);
  await page.screenshot({ path });
  return path;
}

/** Geometry of the data marks of a result's plot (level ticks, spectrum lines): what changes when the data move. */
async function plotMarks(output = cefOutput) {
  return page.$$eval(`${output} figure.jp-Multiplet-plot[data-rendered="true"] svg .role-mark path, ${output} figure.jp-Multiplet-plot[data-rendered="true"] svg .role-mark rect`, (marks) =>
    marks.map((m) => `${m.getAttribute('transform') ?? ''} ${m.getAttribute('d') ?? ''} ${m.getAttribute('y') ?? ''}`),
  );
}
const levelMarks = () => plotMarks(cefOutput);

async function openNotebook(url) {
  await page.goto(url);
  await page.waitForSelector('body[data-multiplet-ready="true"], body[data-multiplet-error]', { state: 'attached', timeout: 90_000 });
  const problem = await page.evaluate(() => document.body.dataset.multipletError ?? null);
  assert.equal(problem, null, `the page did not start: ${problem}`);
}

before(async () => {
  lab = await startLab([join(repoRoot, 'test/lab/notebooks'), join(repoRoot, 'notebooks-demo')]);
  browser = await openBrowser();
  page = await browser.context.newPage();
});

after(async () => {
  await browser?.close();
  await lab?.stop();
});

test('the page loads the prebuilt extension through module federation', async () => {
  assert.ok(lab.pages['bench.ipynb'], `multiplet lab printed no page for bench.ipynb:\n${lab.output()}`);
  await openNotebook(lab.pages['bench.ipynb']);
  const plugins = await page.evaluate(() => window.multipletPage.extension.plugins.map((p) => p.id));
  assert.deepEqual(plugins, ['@multiplet/lab:results', '@multiplet/lab:state-panel', '@multiplet/lab:templates']);
  // The extension's own stylesheet came with it (./style of the remote container).
  const controlsGrid = await page.evaluate(() => {
    const probe = document.createElement('div');
    probe.className = 'jp-Multiplet-controls';
    document.body.appendChild(probe);
    const display = getComputedStyle(probe).display;
    probe.remove();
    return display;
  });
  assert.equal(controlsGrid, 'grid');
  assert.ok(await page.isVisible('#jp-Multiplet-statePanel'), 'the sample-state panel is in the right area');
  assert.match(await page.textContent('.jp-MarkdownOutput'), /A pyrochlore bench/);
  await shot('01-opened');
});

test('run all cells: no error output; level diagram, spectrum and magnetization plots rendered', async () => {
  await page.click('.jp-Toolbar-item >> text=Run All Cells');
  await page.waitForSelector(`${cefOutput} figure.jp-Multiplet-plot[data-rendered="true"] svg`, { timeout: 120_000 });
  assert.equal(await page.locator(errorOutputs).count(), 0, 'no error outputs');
  assert.equal(await page.locator('.jp-Multiplet-result[data-kind="sample"][data-result-name="host"]').count(), 1);
  // The level diagram: an SVG with one tick per level (Dy3+, J = 15/2, Kramers: 8 doublets) and their labels.
  const marks = await levelMarks();
  assert.ok(marks.length >= 8, `level diagram marks: ${marks.length}`);
  // The neutron spectrum computed from cefA: a plot with a drawn line.
  await page.waitForSelector(`${spectrumOutput} figure.jp-Multiplet-plot[data-rendered="true"] svg`, { timeout: 60_000 });
  const spectrum = await plotMarks(spectrumOutput);
  assert.ok(spectrum.some((d) => d.length > 100), 'the spectrum line has a path');
  // The powder magnetization M(B) from cefA: one curve per temperature.
  await page.waitForSelector(`${magnetOutput} figure.jp-Multiplet-plot[data-rendered="true"] svg`, { timeout: 60_000 });
  const curves = (await plotMarks(magnetOutput)).filter((d) => d.length > 50);
  assert.ok(curves.length >= 1, `M(B) curves: ${curves.length}`);
  assert.equal(await page.locator(errorOutputs).count(), 0, 'no error outputs');
  // Tables with units in the headers.
  const headers = await page.$$eval(`${cefOutput} table.jp-Multiplet-table th`, (cells) => cells.map((c) => c.textContent));
  assert.ok(headers.includes('E (meV)'), `table headers: ${headers.join(' | ')}`);
  // Controls: one labelled slider and number field per B_n^m of the cell.
  const labels = await page.$$eval(`${cefOutput} .jp-Multiplet-controlLabel`, (ls) => ls.map((l) => l.textContent));
  assert.deepEqual(labels, ['B20 (meV)', 'B40 (meV)', 'B43 (meV)', 'B60 (meV)', 'B63 (meV)', 'B66 (meV)']);
  const slider = page.getByLabel('B20 (meV)', { exact: true });
  assert.equal(await slider.getAttribute('type'), 'range');
  // The state panel lists the sample, and both results with the cell that made them.
  await page.waitForSelector(stateResult('cefA'));
  assert.match(await page.textContent(stateResult('cefA')), /made by cell 3/);
  assert.match(await page.textContent('.jp-Multiplet-stateCompound'), /DyQ-1/);
  // For the README: the crystal-field cell from its text down to the level diagram.
  await page.evaluate(() => document.querySelector('.jp-Notebook .jp-Cell:nth-child(3)').scrollIntoView({ block: 'start' }));
  await page.waitForTimeout(300);
  const path = await shot('02-run-all');
  // The README's copy is refreshed only on request, so that test runs leave the work tree unchanged.
  if (process.env.MULTIPLET_UPDATE_DOCS === '1') copyFileSync(path, join(repoRoot, 'docs/screenshot-lab.png'));
});

test('moving B20 with the keyboard reruns the cell and its dependants, redrawing the level diagram, spectrum and M(B) in place', async () => {
  const before = await levelMarks();
  const spectrumBefore = await plotMarks(spectrumOutput);
  const magnetBefore = await plotMarks(magnetOutput);
  const summaryBefore = await page.textContent(`${cefOutput} .jp-Multiplet-summary`);
  const slider = page.getByLabel('B20 (meV)', { exact: true });
  await slider.focus();
  for (let i = 0; i < 40; i++) await page.keyboard.press('ArrowRight');
  await page.waitForFunction(
    ([selector, text]) => document.querySelector(selector)?.textContent !== text,
    [`${cefOutput} .jp-Multiplet-summary`, summaryBefore],
    { timeout: 60_000 },
  );
  await page.waitForSelector(`${cefOutput} figure.jp-Multiplet-plot[data-rendered="true"] svg`);
  const after = await levelMarks();
  assert.notDeepEqual(after, before, 'the level diagram changed');
  await page.waitForFunction(
    ([selector, old]) => {
      const marks = Array.from(document.querySelectorAll(`${selector} figure.jp-Multiplet-plot[data-rendered="true"] svg .role-mark path`));
      return marks.length > 0 && JSON.stringify(marks.map((m) => m.getAttribute('d'))) !== old;
    },
    [spectrumOutput, JSON.stringify(spectrumBefore.map((d) => d.split(' ')[1]))],
    { timeout: 60_000 },
  );
  assert.notDeepEqual(await plotMarks(spectrumOutput), spectrumBefore, 'the dependent spectrum changed');
  await page.waitForFunction(
    ([selector, old]) => {
      const marks = Array.from(document.querySelectorAll(`${selector} figure.jp-Multiplet-plot[data-rendered="true"] svg .role-mark path`));
      return marks.length > 0 && JSON.stringify(marks.map((m) => m.getAttribute('d'))) !== old;
    },
    [magnetOutput, JSON.stringify(magnetBefore.map((d) => d.split(' ')[1]))],
    { timeout: 60_000 },
  );
  // Same output, updated in place (update_display_data): still one crystal-field view, focus kept on the slider.
  assert.equal(await page.locator(cefOutput).count(), 1);
  assert.equal(await page.evaluate(() => document.activeElement?.getAttribute('aria-valuetext') !== null), true);
  const value = Number(await page.getByLabel('B20 value in meV').inputValue());
  assert.ok(value > -0.25, `B20 moved up from -0.25 meV, now ${value}`);
  // The notebook text is untouched until asked; then it holds the new value.
  const cellText = () => page.evaluate(() => window.multipletPage.tracker.currentWidget.content.widgets[2].model.sharedModel.getSource());
  assert.match(await cellText(), /B20: -0\.25 meV/);
  await page.click(`${cefOutput} .jp-Multiplet-writeBack`);
  await page.waitForFunction(() => !/B20: -0\.25 meV/.test(window.multipletPage.tracker.currentWidget.content.widgets[2].model.sharedModel.getSource()));
  assert.doesNotMatch(await cellText(), /B20: -0\.25 meV/);
  assert.equal(await page.locator(errorOutputs).count(), 0);
  await shot('03-control-moved');
});

test('rerunning the sample marks the crystal field and spectrum stale (panel and outputs); Rerun stale clears it', async () => {
  await page.waitForSelector(`${stateResult('cefA')}[data-stale="false"]`);
  // Run the sample cell again from its editor (Shift+Enter).
  await page.click('.jp-Notebook .jp-Cell:nth-child(2) .cm-content');
  await page.keyboard.press('Shift+Enter');
  await page.waitForSelector(`${stateResult('cefA')}[data-stale="true"]`, { timeout: 60_000 });
  assert.match(await page.textContent(stateResult('cefA')), /stale/);
  await page.waitForSelector(`${stateResult('spectrumA')}[data-stale="true"]`);
  // The outputs themselves say so (the kernel refreshes their displays with the stale flag).
  await page.waitForSelector(`${cefOutput}.jp-mod-stale .jp-Multiplet-staleMark`);
  await page.waitForSelector(`${spectrumOutput}.jp-mod-stale`);
  await shot('04-stale');
  await page.click('.jp-Multiplet-stateButton >> text=Rerun stale');
  await page.waitForSelector(`${stateResult('cefA')}[data-stale="false"]`, { timeout: 60_000 });
  await page.waitForSelector(`${stateResult('spectrumA')}[data-stale="false"]`);
  assert.equal(await page.locator('.jp-Multiplet-statePanel .jp-Multiplet-staleMark').count(), 0);
  await page.waitForSelector(`${cefOutput}:not(.jp-mod-stale)`);
  await page.waitForSelector(`${spectrumOutput}:not(.jp-mod-stale)`);
  assert.equal(await page.locator(errorOutputs).count(), 0);
  await shot('05-stale-cleared');
});

test('insert a crystal-field template from the palette, run it, break it: precise error, state unchanged', async () => {
  await page.click('.jp-Notebook .jp-Cell:nth-child(3) .jp-InputPrompt');
  await page.keyboard.press('Control+Shift+C');
  await page.waitForSelector('.jp-ModalCommandPalette:not(.lm-mod-hidden) input', { state: 'visible' });
  await page.keyboard.type('Insert crystal-field');
  await page.keyboard.press('Enter');
  const inserted = () => page.evaluate(() => window.multipletPage.tracker.currentWidget.content.activeCell.model.sharedModel.getSource());
  await page.waitForFunction(() => /^\[crystal-field\] crystalField1/.test(window.multipletPage.tracker.currentWidget.content.activeCell?.model.sharedModel.getSource() ?? ''));
  const template = await inserted();
  const templateCell = await page.evaluate(() => window.multipletPage.tracker.currentWidget.content.activeCellIndex);
  assert.match(template, /^# B \(\w+\): Stevens parameters/m);
  assert.match(template, /^B:\n {2}B20: 1 meV$/m);
  await shot('06-template-inserted');
  await page.keyboard.press('Shift+Enter');
  await page.waitForSelector(stateResult('crystalField1'), { timeout: 60_000 });
  await page.waitForSelector('.jp-Multiplet-result[data-result-name="crystalField1"] figure[data-rendered="true"] svg');
  const stateBefore = await page.textContent('.jp-Multiplet-stateResults');

  // Break it, in the same cell: a voltage where an energy belongs.
  const broken = template.replace(/B20: 1 meV/, 'B20: 1 mV');
  assert.notEqual(broken, template);
  await page.click(`.jp-Notebook .jp-Cell:nth-child(${templateCell + 1}) .cm-content`);
  await page.keyboard.press('Control+A');
  await page.keyboard.insertText(broken);
  await page.keyboard.press('Shift+Enter');
  const error = page.locator(`.jp-Notebook .jp-Cell:nth-child(${templateCell + 1})`).locator(errorOutputs).first();
  await error.waitFor({ timeout: 60_000 });
  const message = await error.textContent();
  // The error names the line and column of the value, the field path, what was given and what was expected.
  const lines = broken.split('\n');
  const line = lines.findIndex((l) => l.includes('B20: 1 mV')) + 1;
  const column = lines[line - 1].indexOf('1 mV') + 1;
  assert.match(message, new RegExp(`line ${line}, column ${column}: B\\.B20: got "1 mV", expected a quantity [^;]*meV`));
  // A failing cell changes nothing in the sample state.
  await page.click('.jp-Multiplet-stateButton >> text=Refresh');
  await page.waitForTimeout(500);
  assert.equal(await page.textContent('.jp-Multiplet-stateResults'), stateBefore);
  await shot('07-broken-template');
});

test('save the state file from the panel, then load it back', async () => {
  const stateBefore = await page.textContent('.jp-Multiplet-stateResults');
  await page.click('.jp-Multiplet-stateButton >> text=Save state');
  await page.waitForSelector('.jp-Dialog input');
  assert.equal(await page.inputValue('.jp-Dialog input'), 'sample-state.json');
  await page.click('.jp-Dialog .jp-mod-accept');
  // The kernel wrote it beside the notebook: read it back through the server's contents API.
  const origin = new URL(lab.pages['bench.ipynb']).origin;
  let saved = null;
  for (let i = 0; i < 50 && !saved; i++) {
    const response = await fetch(`${origin}/api/contents/sample-state.json?content=1&type=file&format=text`, { headers: { Authorization: `token ${lab.token}` } });
    if (response.ok) saved = JSON.parse((await response.json()).content);
    else await new Promise((r) => setTimeout(r, 200));
  }
  assert.ok(saved, 'sample-state.json was written');
  assert.equal(saved.format, 'multiplet-state');
  assert.ok(saved.results.cefA && saved.results.crystalField1, `saved results: ${Object.keys(saved.results)}`);
  await page.click('.jp-Multiplet-stateButton >> text=Load state');
  await page.waitForSelector('.jp-Dialog input');
  await page.click('.jp-Dialog .jp-mod-accept');
  await page.waitForSelector('.jp-Dialog', { state: 'detached' });
  await page.waitForTimeout(500);
  assert.equal(await page.textContent('.jp-Multiplet-stateResults'), stateBefore);
  assert.equal(await page.locator('.jp-Dialog').count(), 0, 'no error dialog');
});

test('dark theme: the result view follows it', async () => {
  await openNotebook(lab.pages['bench.ipynb'] + '&theme=dark');
  await page.click('.jp-Toolbar-item >> text=Run All Cells');
  await page.waitForSelector(`${cefOutput} figure.jp-Multiplet-plot[data-rendered="true"] svg`, { timeout: 120_000 });
  const colours = await page.evaluate((selector) => {
    const output = document.querySelector(selector);
    const text = output.querySelector('svg text');
    return { body: getComputedStyle(document.body).backgroundColor, label: text ? getComputedStyle(text).fill : '', theme: document.body.dataset.jpThemeLight };
  }, cefOutput);
  assert.equal(colours.theme, 'false');
  // Light text on the dark layout: the vega "dark" theme, not the default black labels.
  const channels = (css) => (css.match(/\d+/g) ?? []).slice(0, 3).map(Number);
  assert.ok(channels(colours.label).every((c) => c > 128), `axis label colour ${colours.label}`);
  await shot('08-dark');
});

test('demo notebook 03 (magnetization and susceptibility): run all, no error output, plots rendered', async () => {
  assert.ok(lab.pages['03-magnetization-susceptibility.ipynb'], `pages: ${Object.keys(lab.pages)}`);
  await openNotebook(lab.pages['03-magnetization-susceptibility.ipynb']);
  const codeCells = await page.evaluate(() => window.multipletPage.tracker.currentWidget.content.widgets.filter((c) => c.model.type === 'code').length);
  await page.click('.jp-Toolbar-item >> text=Run All Cells');
  await page.waitForFunction(
    (count) => {
      const cells = window.multipletPage.tracker.currentWidget.content.widgets.filter((c) => c.model.type === 'code');
      return cells.length === count && cells.every((c) => typeof c.model.executionCount === 'number') && window.multipletPage.tracker.currentWidget.sessionContext.kernelDisplayStatus === 'idle';
    },
    codeCells,
    { timeout: 300_000 },
  );
  assert.equal(await page.locator(errorOutputs).count(), 0, 'no error outputs');
  await page.waitForSelector('.jp-Multiplet-result[data-kind="crystal-field"] figure.jp-Multiplet-plot[data-rendered="true"] svg');
  // The script cells' vega-lite plots (M(B) and χ(T) with the data) through JupyterLab's vega renderer.
  const vegaPlots = '.jp-RenderedVegaCommon5 canvas, .jp-RenderedVegaCommon5 svg';
  await page.waitForSelector(vegaPlots, { state: 'attached', timeout: 60_000 });
  const scriptPlots = await page.locator(vegaPlots).count();
  assert.ok(scriptPlots >= 2, `script-cell plots rendered: ${scriptPlots}`);
  await page.locator('.jp-Multiplet-result[data-kind="crystal-field"]').first().scrollIntoViewIfNeeded();
  await shot('09-demo-03');
  await page.locator('.jp-RenderedVegaCommon5').last().scrollIntoViewIfNeeded();
  await shot('10-demo-03-script-plots');
});

test('no browser console errors on any page', () => {
  assert.deepEqual(browser.consoleErrors, []);
});
