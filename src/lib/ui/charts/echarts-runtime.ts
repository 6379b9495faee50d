/**
 * The only module that imports ECharts. It is loaded with a dynamic import from ChartPanel, so the chart
 * library is a chunk of its own and never part of the first page. Only the pieces used are registered.
 */
import { BarChart, LineChart, ScatterChart } from 'echarts/charts';
import {
  AriaComponent,
  GridComponent,
  LegendComponent,
  MarkLineComponent,
  TitleComponent,
  TooltipComponent
} from 'echarts/components';
import { init, use, type ECharts, type EChartsCoreOption } from 'echarts/core';
import { CanvasRenderer, SVGRenderer } from 'echarts/renderers';

use([
  BarChart,
  LineChart,
  ScatterChart,
  AriaComponent,
  GridComponent,
  LegendComponent,
  MarkLineComponent,
  TitleComponent,
  TooltipComponent,
  SVGRenderer,
  CanvasRenderer
]);

export function createChart(element: HTMLElement): ECharts {
  return init(element, undefined, { renderer: 'svg' });
}

/**
 * A chart as PNG, drawn apart from the page by the library's canvas painter at `scale` times its size, on a white
 * ground. Drawing the on-screen SVG into a canvas was one step of the browser's: at 20 000 processes a chart of
 * every process took a task of 115–166 ms; the canvas painter draws a long series over a few frames, and the
 * image is encoded off the page's thread (toBlob).
 */
export function chartPng(
  option: EChartsCoreOption,
  width: number,
  height: number,
  scale: number
): Promise<Blob> {
  const chart = init(document.createElement('div'), undefined, {
    renderer: 'canvas',
    width,
    height,
    devicePixelRatio: scale
  });
  return new Promise<Blob>((resolve, reject) => {
    const fail = (error: unknown) => {
      chart.dispose();
      reject(error instanceof Error ? error : new Error(String(error)));
    };
    chart.on('finished', () => {
      if (chart.isDisposed()) return;
      try {
        const canvas = chart.renderToCanvas({ backgroundColor: '#ffffff', pixelRatio: scale });
        chart.dispose();
        canvas.toBlob(
          (blob) => (blob ? resolve(blob) : reject(new Error('the chart could not be turned into an image'))),
          'image/png'
        );
      } catch (error) {
        fail(error);
      }
    });
    try {
      chart.setOption(option);
    } catch (error) {
      fail(error);
    }
  });
}

let warmed = false;

/** A warm-up drawing set out as the review's charts are (warmUpSteps); `full` adds the tooltip and the stack. */
function reportLike(full: boolean): () => void {
  return () => {
    const names = Array.from({ length: 24 }, (_, i) => `name ${'x'.repeat(i)}`);
    const chart = init(document.createElement('div'), undefined, {
      renderer: 'svg',
      width: 640,
      height: 360
    });
    chart.setOption({
      animation: false,
      grid: { left: 8, right: 24, top: 28, bottom: 24, containLabel: true },
      legend: { top: 0, data: ['a', 'b', 'c'] },
      ...(full ? { tooltip: { trigger: 'axis', renderMode: 'richText' } } : {}),
      xAxis: {
        type: 'value',
        name: 'x',
        nameLocation: 'middle',
        nameGap: 24,
        min: (v: { min: number }) => Math.floor(v.min),
        max: (v: { max: number }) => Math.ceil(v.max)
      },
      yAxis: {
        type: 'category',
        data: names,
        inverse: true,
        axisLabel: { width: 120, overflow: 'truncate', interval: 0 }
      },
      series: full
        ? [
            { type: 'bar', name: 'a', stack: 's', data: names.map((_, i) => (i % 2 ? i : '-')) },
            { type: 'bar', name: 'b', stack: 's', data: names.map((_, i) => (i % 2 ? '-' : i)) },
            {
              type: 'scatter',
              name: 'c',
              symbol: 'rect',
              symbolSize: [3, 14],
              data: names.map((_, i) => i + 1)
            }
          ]
        : [{ type: 'bar', name: 'a', data: names.map((_, i) => i) }]
    });
    chart.dispose();
  };
}

/**
 * Small drawings, one kind of series each, made on a detached element before a page's first chart: the chart
 * library's first use (its code compiled as it first runs) was the longest task of the quarterly review
 * (0.3–0.6 s, CPU throttled 4×); run one per task, they spread that cost over several short tasks. Given once per
 * page load; empty after.
 */
export function warmUpSteps(): (() => void)[] {
  if (warmed) return [];
  warmed = true;
  const draw = (series: object[]) => () => {
    const chart = init(document.createElement('div'), undefined, { renderer: 'svg', width: 120, height: 80 });
    chart.setOption({
      animation: false,
      legend: {},
      tooltip: { renderMode: 'richText' },
      xAxis: { type: 'category', data: ['a', 'b'] },
      yAxis: { type: 'value' },
      series
    });
    chart.dispose();
  };
  return [
    // The library's own start (an instance and its SVG painter, no option), apart from the first drawing.
    () =>
      init(document.createElement('div'), undefined, { renderer: 'svg', width: 120, height: 80 }).dispose(),
    draw([{ type: 'bar', name: 'a', data: [1, 2] }]),
    draw([{ type: 'line', name: 'a', data: [1, 2] }]),
    draw([
      {
        type: 'scatter',
        name: 'a',
        data: [
          [0, 1],
          [1, 2]
        ],
        markLine: { data: [{ yAxis: 1 }] }
      }
    ]),
    // Charts as the review's are set out — legend, axis tooltip, named axes, limits from functions, a category
    // axis down the side with names cut to a width, stacked bars — at a report's size, the plainer first: what
    // the tiny drawings above never run made the review's first real chart its longest task (90–105 ms, CPU
    // throttled 4×); in one step it was a task of 80–90 ms itself.
    reportLike(false),
    reportLike(true),
    // A scatter drawn as one path from pairs in a typed array (the review's charts of every process, past a few
    // hundred points: review-chart-options.ts, scatterPoints), whose code the small scatter above never runs:
    // its first use was the review's longest task (0.2–0.25 s, CPU 4×).
    draw([
      {
        type: 'scatter',
        name: 'a',
        large: true,
        largeThreshold: 1,
        symbol: 'rect',
        symbolSize: [3, 14],
        data: new Float64Array([0, 1, 1, 2])
      }
    ])
  ];
}
