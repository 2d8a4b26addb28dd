import { colors } from './theme';

/** Page-wide rules the web build adds: page colours, a strong focus ring, and print output in black on white. */
export const pageCss = `
html, body { background-color: ${colors.paper}; color: ${colors.ink}; }
:focus-visible { outline: 3px solid ${colors.focus} !important; outline-offset: 2px; }
@media print {
  html, body, #root { background: #fff !important; height: auto !important; overflow: visible !important; }
  [data-print="hide"], [role="navigation"] { display: none !important; }
  [data-testid="print-screen"], [data-testid="print-screen"] * { color: #000 !important; border-color: #000 !important; background-color: transparent !important; }
  [data-testid="print-screen"] { overflow: visible !important; height: auto !important; }
}
@page { margin: 12mm; }
`;
