/**
 * Trivalent rare-earth ions: 4f^n, Hund's-rule S, L, J, Landé g_J, Stevens factors, radial integrals.
 * See ions/ionTable.ts for the sources of every number.
 */
export { getIon, ION_NAMES, stevensFactor, type Ion } from './ionTable';
export { hundsRuleTerm, type HundsTerm } from './hundsRules';
export { landeG } from './landeG';
