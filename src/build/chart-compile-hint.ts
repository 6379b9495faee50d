import type { Plugin } from 'vite';

/** The comment that asks V8 (Chrome 136 and later) to compile every function of a file as it streams in. */
export const COMPILE_ALL_HINT = '//# allFunctionsCalledOnLoad';

/** Whether a chunk holds the chart library (ECharts and its renderer, zrender). */
function holdsChartLibrary(moduleIds: readonly string[]): boolean {
  return moduleIds.some((id) => /[\\/]node_modules[\\/](echarts|zrender)[\\/]/.test(id));
}

/**
 * Marks the chart library's chunk with V8's explicit compile hint. That chunk is loaded when a page first draws
 * a chart, and most of its functions run at once (the library's start, the SVG painter, a series of each kind):
 * compiled lazily, they were compiled on the page's thread inside those first drawings — the quarterly review's
 * longest tasks. With the hint, Chrome compiles them on the thread that streams the file. Over eight cold visits
 * each way (browser cache cleared, CPU throttled 4×) of the review at 2 000 processes, the longest task after
 * the headline was 96–278 ms without the hint (two over 190 ms) and at most 137 ms with it. Browsers that do not
 * know the comment ignore it.
 */
export function chartCompileHint(): Plugin {
  return {
    name: 'capstan-chart-compile-hint',
    apply: 'build',
    // After minifying (which drops comments): the code as it is written out.
    generateBundle(_options, bundle) {
      for (const file of Object.values(bundle)) {
        if (file.type !== 'chunk' || !holdsChartLibrary(file.moduleIds)) continue;
        // At the very top, where V8 looks for it; no source map is built for the app, so none is shifted.
        file.code = `${COMPILE_ALL_HINT}\n${file.code}`;
      }
    }
  };
}
