import { useEffect } from 'react';
import { Platform } from 'react-native';

/**
 * Spread on a View to leave it out of printouts (the print style sheet hides
 * [data-print-hide="true"]). react-native-web renders `dataSet` as data-* attributes;
 * React Native's types do not list it.
 */
export const printHide = { dataSet: { printHide: 'true' } } as object;

/** Spread on the shell's scroll view so a printout shows all of it, not one window's worth. */
export const printExpand = { dataSet: { printExpand: 'true' } } as object;

const PRINT_CSS =
  '@media print { [data-print-hide="true"] { display: none !important; } body { background: #fff; } ' +
  // The shell scrolls inside a fixed-height view; printing must show all of it.
  'html, body, #root, [data-print-expand="true"] { height: auto !important; overflow: visible !important; } }';

/** Adds the print style sheet while a printable screen is shown (web only). */
export function usePrintStyle(): void {
  useEffect(() => {
    if (Platform.OS !== 'web' || typeof document === 'undefined') return;
    const style = document.createElement('style');
    style.textContent = PRINT_CSS;
    document.head.appendChild(style);
    return () => style.remove();
  }, []);
}

export function printPage(): void {
  if (Platform.OS === 'web' && typeof window !== 'undefined') window.print();
}
