import { LabIcon } from '@jupyterlab/ui-components';

/** Four levels of a split multiplet: the sample-state panel's tab icon. */
const LEVELS_SVG =
  '<svg xmlns="http://www.w3.org/2000/svg" width="16" height="16" viewBox="0 0 16 16"><g class="jp-icon3" fill="#616161">' +
  '<rect x="2" y="13" width="12" height="1.6"/><rect x="2" y="8.5" width="12" height="1.6"/>' +
  '<rect x="2" y="6" width="12" height="1.6"/><rect x="2" y="1.5" width="12" height="1.6"/></g></svg>';

export const levelsIcon = new LabIcon({ name: 'multiplet:levels', svgstr: LEVELS_SVG });
