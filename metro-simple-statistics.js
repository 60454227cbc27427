// The web bundle's simple-statistics: the same library code, one function per module, instead of
// its browser build, which carries all ~100 functions (about 33 KB minified) because Metro keeps
// unused exports. It must export every name that shared/ or components/ imports from
// 'simple-statistics'; tests/unit/metro-shims.test.ts checks that.
export { default as mean } from './node_modules/simple-statistics/src/mean.js';
export { default as median } from './node_modules/simple-statistics/src/median.js';
export { default as sampleStandardDeviation } from './node_modules/simple-statistics/src/sample_standard_deviation.js';
export { default as sampleVariance } from './node_modules/simple-statistics/src/sample_variance.js';
