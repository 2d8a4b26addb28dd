/**
 * The SVG plots, loaded as one chunk on first use (see ./plots.tsx): react-native-svg and d3-shape
 * are then fetched only by the screens that draw a plot, not with the first page.
 */
export { LiftPlot } from '@/components/compare/lift-plot';
export { LobeOverlay } from '@/components/measure/lobe-overlay';
export { MarginPlot } from '@/components/compare/margin-plot';
