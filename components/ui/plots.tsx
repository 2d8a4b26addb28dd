import { lazy, Suspense, type ComponentProps } from 'react';
import { View } from 'react-native';

import type * as PlotViews from './plot-views';

/*
 * The plots come from one import() of ./plot-views, so react-native-svg, d3-shape and the path
 * builders form a single chunk that only the plotting screens fetch. Were each screen to import
 * them directly, the web export would put them in the common chunk that every first load carries.
 * Until the chunk arrives the plot's space is held empty, as the plots do before they are measured.
 */
const loadPlots = () => import('./plot-views');
const LazyLiftPlot = lazy(() => loadPlots().then((m) => ({ default: m.LiftPlot })));
const LazyLobeOverlay = lazy(() => loadPlots().then((m) => ({ default: m.LobeOverlay })));
const LazyMarginPlot = lazy(() => loadPlots().then((m) => ({ default: m.MarginPlot })));

/** Overlaid intake and exhaust curves against crank angle (components/compare/lift-plot.tsx), loaded on first use. */
export function LiftPlot(props: ComponentProps<typeof PlotViews.LiftPlot>) {
  return (
    <Suspense fallback={<View style={{ height: props.height ?? 300 }} />}>
      <LazyLiftPlot {...props} />
    </Suspense>
  );
}

/** One measured lobe over the sheet's lobe (components/measure/lobe-overlay.tsx), loaded on first use. */
export function LobeOverlay(props: ComponentProps<typeof PlotViews.LobeOverlay>) {
  return (
    <Suspense fallback={<View style={{ height: props.height ?? 240 }} />}>
      <LazyLobeOverlay {...props} />
    </Suspense>
  );
}

/** Metal between the old lobe and the new one against cam angle (components/compare/margin-plot.tsx), loaded on first use. */
export function MarginPlot(props: ComponentProps<typeof PlotViews.MarginPlot>) {
  return (
    <Suspense fallback={<View style={{ height: props.height ?? 220 }} />}>
      <LazyMarginPlot {...props} />
    </Suspense>
  );
}
