/**
 * The demo lobe table (invented data, labelled as such in its first line):
 * cam lift of all 16 lobes of the demo 5.9 L V8's stock-spec regrind core,
 * every 2 crank degrees across each lobe's event, in Lobewright's lobe-table
 * CSV format. The cylinder 3 exhaust lobe is worn about 0.012 in below its
 * neighbours, as in the demo story. Run `npx tsx db/demo-lobes.ts` to rewrite
 * assets/demo/lobes-demo.csv.
 */
import fs from 'node:fs';
import path from 'node:path';

import { DEMO_STOCK_REGRIND } from '@/calc/demo';
import { lobeLiftAt, synthesizeLobe } from '@/calc/lift-curve';

export const demoLobesFile = path.resolve(__dirname, '..', 'assets', 'demo', 'lobes-demo.csv');

export const demoLobeIds = Array.from({ length: 8 }, (_, i) => [`${i + 1}I`, `${i + 1}E`]).flat();

/** How far the worn lobe's max lift sits below nominal, inches (demo story). */
export const demoWornLobe = { id: '3E', shortfall: 0.012 } as const;

/** Small lobe-to-lobe differences in max lift, inches, as a real core would show (invented, fixed). */
const spread = [0.0004, -0.0003, 0.0001, 0.0006, -0.0005, 0.0002, -0.0001, 0.0003, 0.0005, -0.0004, 0, -0.0002, 0.0002, 0.0004, -0.0006, 0.0001];

export function demoLobeCsv(): string {
  const p = DEMO_STOCK_REGRIND;
  const intake = synthesizeLobe(p.intake);
  const exhaust = synthesizeLobe(p.exhaust);
  const icl = p.icl;
  const exhaustCentre = -(2 * p.lsa - p.icl);
  const from = 2 * Math.floor((exhaustCentre - exhaust.halfEvent) / 2) - 2;
  const to = 2 * Math.ceil((icl + intake.halfEvent) / 2) + 2;
  const lines = [
    "# Lobewright demo data (invented): cam lift in inches of a 5.9 L V8 regrind core; crank degrees from each cylinder's overlap TDC",
    ['angle', ...demoLobeIds].join(','),
  ];
  for (let angle = from; angle <= to; angle += 2) {
    const cells = demoLobeIds.map((id, i) => {
      const isIntake = id.endsWith('I');
      const shape = isIntake ? intake : exhaust;
      const nominal = lobeLiftAt(shape, angle - (isIntake ? icl : exhaustCentre)).lift;
      const top = shape.lobeLift + (id === demoWornLobe.id ? -demoWornLobe.shortfall : (spread[i] ?? 0));
      return (nominal * (top / shape.lobeLift)).toFixed(4);
    });
    lines.push([String(angle), ...cells].join(','));
  }
  return `${lines.join('\n')}\n`;
}

if (require.main === module) {
  fs.mkdirSync(path.dirname(demoLobesFile), { recursive: true });
  fs.writeFileSync(demoLobesFile, demoLobeCsv());
  console.log(`Wrote ${demoLobesFile}`);
}
