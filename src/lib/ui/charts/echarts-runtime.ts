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
