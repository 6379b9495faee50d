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
import { init, use, type ECharts } from 'echarts/core';
import { SVGRenderer } from 'echarts/renderers';

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
  SVGRenderer
]);

export function createChart(element: HTMLElement): ECharts {
  return init(element, undefined, { renderer: 'svg' });
}
