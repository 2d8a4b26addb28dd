import { draftsFor, rangeOf, type NumberDraft, type NumberSpec } from '@/lib/number-draft';
import { lobeSchema, profileSpecSchema, type ProfileSpec } from '@/shared/profile';

const range = rangeOf;

const lobe = lobeSchema.shape;
const spec = profileSpecSchema.shape;

export const lobeKeys = ['duration050', 'advertisedDuration', 'advertisedHeight', 'lobeLift', 'lash'] as const;
export type LobeKey = (typeof lobeKeys)[number];
export const sides = ['intake', 'exhaust'] as const;
export type Side = (typeof sides)[number];
export const sideLabels: Record<Side, string> = { intake: 'Intake', exhaust: 'Exhaust' };

/** One lobe's number fields. Labels name the side so every error stands on its own. */
export function lobeSpecs(side: Side): Record<LobeKey, NumberSpec> {
  const name = sideLabels[side];
  return {
    duration050: {
      path: `spec.${side}.duration050`,
      label: `${name} duration at 0.050 in`,
      quantity: null,
      unit: '° crank',
      digits: 0,
      ...range(lobe.duration050),
    },
    advertisedDuration: {
      path: `spec.${side}.advertisedDuration`,
      label: `${name} advertised duration`,
      quantity: null,
      unit: '° crank',
      digits: 0,
      hint: 'Longer than the duration at 0.050 in',
      ...range(lobe.advertisedDuration),
    },
    advertisedHeight: {
      path: `spec.${side}.advertisedHeight`,
      label: `${name} advertised checking height`,
      quantity: 'length',
      unit: 'in',
      digits: 3,
      hint: 'Tappet lift the grinder states the advertised duration at',
      ...range(lobe.advertisedHeight),
    },
    lobeLift: {
      path: `spec.${side}.lobeLift`,
      label: `${name} lobe lift`,
      quantity: 'length',
      unit: 'in',
      digits: 3,
      hint: 'At the lobe, before the rocker ratio',
      ...range(lobe.lobeLift),
    },
    lash: {
      path: `spec.${side}.lash`,
      label: `${name} lash`,
      quantity: 'length',
      unit: 'in',
      digits: 3,
      hint: '0 for hydraulic lifters',
      ...range(lobe.lash),
    },
  };
}

export const profileNumberSpecs = {
  intake: lobeSpecs('intake'),
  exhaust: lobeSpecs('exhaust'),
  lsa: {
    path: 'spec.lsa',
    label: 'Lobe separation angle',
    quantity: null,
    unit: '° cam',
    digits: 0,
    hint: 'Ground into the cam; cam degrees',
    ...range(spec.lsa),
  },
  icl: {
    path: 'spec.icl',
    label: 'Intake centreline',
    quantity: null,
    unit: '° ATDC',
    digits: 0,
    hint: 'As installed; crank degrees after TDC',
    ...range(spec.icl),
  },
  baseCircle: {
    path: 'spec.baseCircle',
    label: 'Base circle',
    quantity: 'length',
    unit: 'in',
    digits: 3,
    optional: true,
    hint: 'Diameter; leave blank if the grinder has not stated it',
    ...range(spec.baseCircle),
  },
} as const;

export const profileNumberList: readonly NumberSpec[] = [
  ...sides.flatMap((side) => lobeKeys.map((key) => profileNumberSpecs[side][key])),
  profileNumberSpecs.lsa,
  profileNumberSpecs.icl,
  profileNumberSpecs.baseCircle,
];

export type LobeDraft = Record<LobeKey, NumberDraft>;
export type ProfileDraft = {
  label: string;
  coreNotes: string;
  spec: { intake: LobeDraft; exhaust: LobeDraft; lsa: NumberDraft; icl: NumberDraft; baseCircle: NumberDraft };
};

export const profileFieldPaths: readonly string[] = ['label', 'coreNotes', ...profileNumberList.map((s) => s.path)];

/** Checking heights grinders commonly state advertised duration at, in inches. */
export const advertisedHeightPicks = [0.004, 0.006, 0.02] as const;

/** The form's starting values. A new profile starts with zero lash (hydraulic) and nothing else filled in. */
export function profileDraftFrom(profile: { label: string; coreNotes: string; spec: ProfileSpec } | null | undefined): ProfileDraft {
  const record = profile ?? { spec: { intake: { lash: 0 }, exhaust: { lash: 0 } } };
  return {
    label: profile?.label ?? '',
    coreNotes: profile?.coreNotes ?? '',
    spec: (draftsFor(profileNumberList, record) as { spec: ProfileDraft['spec'] }).spec,
  };
}
