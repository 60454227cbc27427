// Every Skia chart view of the web app, behind one import() target (see lazySkiaView).
export { default as DifferenceChartView } from './difference-chart-view';
export { default as PairLinesChartView } from './pair-lines-chart-view';
export { default as RankingChartView } from './ranking-chart-view';
