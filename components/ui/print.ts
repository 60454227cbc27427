/**
 * Spread on a View to leave it out of printouts (the print style sheet hides
 * [data-print-hide="true"]). react-native-web renders `dataSet` as data-* attributes;
 * React Native's types do not list it.
 */
export const printHide = { dataSet: { printHide: 'true' } } as object;

/** Spread on the shell's scroll view so a printout shows all of it, not one window's worth. */
export const printExpand = { dataSet: { printExpand: 'true' } } as object;
