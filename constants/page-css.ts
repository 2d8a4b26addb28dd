import { colors } from '@/constants/theme';

/** Page-wide rules the web build adds: page colours, a strong focus ring, and print output in black on white. */
export const pageCss = `
html, body { background-color: ${colors.paper}; color: ${colors.ink}; }
:focus-visible { outline: 3px solid ${colors.focus} !important; outline-offset: 2px; }
@media print {
  html, body, #root { background: #fff !important; height: auto !important; overflow: visible !important; }
  [data-print="hide"], [role="navigation"] { display: none !important; }
  [data-testid="print-screen"], [data-testid="print-screen"] * { color: #000 !important; border-color: #000 !important; background-color: transparent !important; }
  /* React Native Web fills the window with flex and absolute boxes; on paper the print sheet and every box around it flow as blocks instead. */
  #root div:has([data-testid="print-screen"]), [data-testid="print-screen"] {
    display: block !important; position: static !important; height: auto !important; min-height: 0 !important;
    overflow: visible !important; transform: none !important; background: #fff !important;
  }
  [data-testid="print-plot"] path { stroke: #000 !important; }
  #root div:has([data-testid="print-screen"]) > div:not(:has([data-testid="print-screen"])):not([data-testid="print-screen"]) { display: none !important; }
}
@page { margin: 12mm; }
`;
