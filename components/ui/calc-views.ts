/**
 * The one chunk the browser fetches for calc: the SVG plots (react-native-svg, d3-shape and the path
 * builders) and the calc entry points the screens run (the compare analysis, the job's core, a revision's
 * analysis, the lobe table's reading). Screens reach it only through ./lazy-calc.tsx, so the web export
 * keeps calc and the plots out of the first load; a calc module a screen imported directly would be
 * shared by two route chunks and land in the common chunk that every first load carries.
 */
export { LiftPlot } from '@/components/compare/lift-plot';
export { LobeOverlay } from '@/components/measure/lobe-overlay';
export { MarginPlot } from '@/components/compare/margin-plot';

export { analyzeColumn, summarizeColumns } from '@/lib/compare-analysis';
export { analyzeLobes } from '@/lib/lobe-analysis';
export { analyzeRecords } from '@/shared/analysis';
export { jobCore } from '@/shared/job-core';
