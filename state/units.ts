import { useAtom } from 'jotai';
import { atomWithStorage } from 'jotai/utils';
import { useEffect, useMemo, useState } from 'react';

/** What the engine and spring fields show: inches, lbf and lbf/in, or millimetres, newtons and N/mm. */
export type LengthSystem = 'imperial' | 'metric';
/** Chamber and piston volumes: cc or cubic inches. */
export type VolumeUnit = 'cc' | 'in3';
export type Quantity = 'length' | 'volume' | 'force' | 'rate';

export const lengthSystemAtom = atomWithStorage<LengthSystem>('lobewright.lengthSystem', 'imperial');
export const volumeUnitAtom = atomWithStorage<VolumeUnit>('lobewright.volumeUnit', 'cc');

type Units = typeof import('@/calc/units');

/** calc/units carries mathjs; load it only when someone asks for a unit calc does not use inside. */
let unitsModule: Promise<Units> | null = null;
const loadUnits = () => (unitsModule ??= import('@/calc/units'));

export type UnitConverter = {
  /** calc's unit (in, cc, lbf, lbf/in) to the shown unit. */
  toShown: (quantity: Quantity, value: number) => number;
  /** The shown unit back to calc's unit. */
  fromShown: (quantity: Quantity, value: number) => number;
  label: (quantity: Quantity) => string;
  /** Decimal places that keep the precision a shop writes down. */
  digits: (quantity: Quantity, calcDigits: number) => number;
};

const identity: UnitConverter['toShown'] = (_q, v) => v;

/** The converter for a choice of units, on calc/units (mathjs); without the module loaded it shows calc's own units. */
export function unitConverter(units: Units | null, lengthSystem: LengthSystem, volumeUnit: VolumeUnit): UnitConverter {
  const metric = lengthSystem === 'metric';
  const in3 = volumeUnit === 'in3';
  return {
    toShown: !units
      ? identity
      : (q, v) =>
          q === 'length' && metric
            ? units.inchesToMm(v)
            : q === 'force' && metric
              ? units.lbfToNewtons(v)
              : q === 'rate' && metric
                ? units.lbfPerInchToNPerMm(v)
                : q === 'volume' && in3
                  ? units.ccToCubicInches(v)
                  : v,
    fromShown: !units
      ? identity
      : (q, v) =>
          q === 'length' && metric
            ? units.mmToInches(v)
            : q === 'force' && metric
              ? units.newtonsToLbf(v)
              : q === 'rate' && metric
                ? units.nPerMmToLbfPerInch(v)
                : q === 'volume' && in3
                  ? units.cubicInchesToCc(v)
                  : v,
    label: (q) =>
      q === 'length' ? (metric ? 'mm' : 'in') : q === 'force' ? (metric ? 'N' : 'lbf') : q === 'rate' ? (metric ? 'N/mm' : 'lbf/in') : in3 ? 'in³' : 'cc',
    digits: (q, calcDigits) => (q === 'length' && metric ? Math.max(0, calcDigits - 1) : q === 'volume' && in3 ? calcDigits + 2 : calcDigits),
  };
}

/** calc's own units (in, cc, lbf, lbf/in), with no conversion: for forms whose numbers all have a fixed unit, such as money and days. */
export const calcUnits: UnitConverter = unitConverter(null, 'imperial', 'cc');

/** The chosen units and a converter built on mathjs units; `converter` is null while mathjs loads. */
export function useUnits() {
  const [lengthSystem, setLengthSystem] = useAtom(lengthSystemAtom);
  const [volumeUnit, setVolumeUnit] = useAtom(volumeUnitAtom);
  const needsMath = lengthSystem === 'metric' || volumeUnit === 'in3';
  const [units, setUnits] = useState<Units | null>(null);
  const [loadError, setLoadError] = useState<Error | null>(null);

  useEffect(() => {
    if (!needsMath || units) return;
    let live = true;
    loadUnits().then(
      (m) => live && setUnits(m),
      (e: unknown) => live && setLoadError(e instanceof Error ? e : new Error('Could not load unit conversion')),
    );
    return () => {
      live = false;
    };
  }, [needsMath, units]);

  // One converter object per choice of units, so screens can key memos and effects on it.
  const converter = useMemo(() => (needsMath && !units ? null : unitConverter(units, lengthSystem, volumeUnit)), [needsMath, units, lengthSystem, volumeUnit]);

  return { lengthSystem, setLengthSystem, volumeUnit, setVolumeUnit, converter, loadError };
}
