import { use } from 'react';
import { View } from 'react-native';

import type * as CalcViews from './calc-views';
import { lazyView } from './lazy-view';

/*
 * Calc and the plots come from one import() of ./calc-views, so the calc engine, react-native-svg,
 * d3-shape and the path builders form a single chunk that only the screens that analyse or plot fetch.
 * Were each screen to import them directly, the web export would put them in the common chunk that
 * every first load carries. Until the chunk arrives a plot's space is held empty, as the plots do
 * before they are measured, and a screen that runs calc shows its own "loading" in a Suspense fallback.
 */
let calcModule: Promise<typeof CalcViews> | null = null;
const loadCalc = () => (calcModule ??= import('./calc-views'));

/**
 * Calc's entry points for a screen (./calc-views.ts). Suspends until the chunk has loaded, so call it
 * under a Suspense boundary; the promise is loaded once and shared.
 */
export function useCalc(): typeof CalcViews {
  return use(loadCalc());
}

/** Holds a plot's space, at its own height or the plot's default, until the chunk arrives. */
function heldSpace(height: number) {
  return function HeldSpace(props: { height?: number }) {
    return <View style={{ height: props.height ?? height }} />;
  };
}

/** Overlaid intake and exhaust curves against crank angle (components/compare/lift-plot.tsx), loaded on first use. */
export const LiftPlot = lazyView(() => loadCalc().then((m) => m.LiftPlot), heldSpace(300));

/** One measured lobe over the sheet's lobe (components/measure/lobe-overlay.tsx), loaded on first use. */
export const LobeOverlay = lazyView(() => loadCalc().then((m) => m.LobeOverlay), heldSpace(240));

/** Metal between the old lobe and the new one against cam angle (components/compare/margin-plot.tsx), loaded on first use. */
export const MarginPlot = lazyView(() => loadCalc().then((m) => m.MarginPlot), heldSpace(220));
