import type { RevisionSummary } from '@/shared/sheets';

export type RevisionChange = { path: string; label: string; from: string; to: string };

const labels: Record<string, string> = {
  label: 'Profile name',
  note: 'Note',
  coreNotes: 'Core notes',
  'spec.intake.duration050': 'Intake duration at 0.050 in (°)',
  'spec.intake.advertisedDuration': 'Intake advertised duration (°)',
  'spec.intake.advertisedHeight': 'Intake advertised height (in)',
  'spec.intake.lobeLift': 'Intake lobe lift (in)',
  'spec.intake.lash': 'Intake lash (in)',
  'spec.exhaust.duration050': 'Exhaust duration at 0.050 in (°)',
  'spec.exhaust.advertisedDuration': 'Exhaust advertised duration (°)',
  'spec.exhaust.advertisedHeight': 'Exhaust advertised height (in)',
  'spec.exhaust.lobeLift': 'Exhaust lobe lift (in)',
  'spec.exhaust.lash': 'Exhaust lash (in)',
  'spec.lsa': 'Lobe separation (° cam)',
  'spec.icl': 'Intake centreline (° ATDC)',
  'spec.baseCircle': 'Base circle (in)',
  'engine.cylinders': 'Engine: cylinders',
  'engine.bore': 'Engine: bore (in)',
  'engine.stroke': 'Engine: stroke (in)',
  'engine.rodLength': 'Engine: rod length (in)',
  'engine.chamberCc': 'Engine: chamber (cc)',
  'engine.gasketBore': 'Engine: gasket bore (in)',
  'engine.gasketThickness': 'Engine: gasket thickness (in)',
  'engine.deckClearance': 'Engine: deck clearance (in)',
  'engine.pistonCc': 'Engine: piston dome/dish (cc)',
  'engine.valveAngle': 'Engine: valve angle (°)',
  'engine.rockerRatioIntake': 'Engine: intake rocker ratio',
  'engine.rockerRatioExhaust': 'Engine: exhaust rocker ratio',
  'engine.lifterType': 'Engine: lifter type',
  'engine.firingOrder': 'Engine: firing order',
  'engine.spring.seatLoad': 'Spring: seat load (lbf)',
  'engine.spring.rate': 'Spring: rate (lbf/in)',
  'engine.spring.installedHeight': 'Spring: installed height (in)',
  'engine.spring.coilBindHeight': 'Spring: coil-bind height (in)',
  'engine.spring.retainerToSeal': 'Spring: retainer-to-seal at seat (in)',
};

function flatten(value: unknown, prefix: string, out: Map<string, string>) {
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value)) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  } else {
    out.set(prefix, value === null || value === undefined ? '—' : String(value));
  }
}

/** What a builder entered that differs between two revisions: profile values, engine snapshot, name, note and core notes. */
export function diffRevisions(a: RevisionSummary, b: RevisionSummary): RevisionChange[] {
  const left = new Map<string, string>();
  const right = new Map<string, string>();
  for (const [map, r] of [
    [left, a],
    [right, b],
  ] as const) {
    flatten({ label: r.label, note: r.note, coreNotes: r.coreNotes, spec: r.spec, engine: r.engine }, '', map);
  }
  const paths = [...new Set([...left.keys(), ...right.keys()])];
  return paths.filter((p) => left.get(p) !== right.get(p)).map((p) => ({ path: p, label: labels[p] ?? p, from: left.get(p) ?? '—', to: right.get(p) ?? '—' }));
}
