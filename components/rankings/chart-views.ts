// Every Skia chart view of the web app, behind one import() target (see lazySkiaView).
export { default as RankingChartView } from './ranking-chart-view';
