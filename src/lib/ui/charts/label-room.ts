import type { EChartsCoreOption } from 'echarts/core';

/** The share of a chart's width the names of its categories may take when they run down the side. */
export const LABEL_SHARE = 0.4;

/**
 * An option whose category names down the side (a horizontal bar chart's) take at most LABEL_SHARE of the width
 * the chart is drawn at. Options are written before that width is known, with room for long names on a wide
 * screen: on a phone those names took all but a few pixels of the chart, and its bars and scale ran together. The
 * option is returned as it is where nothing needs to change.
 */
export function withLabelRoom(option: EChartsCoreOption, width: number): EChartsCoreOption {
  const yAxis = (option as { yAxis?: unknown }).yAxis;
  if (!yAxis || Array.isArray(yAxis) || typeof yAxis !== 'object') return option;
  const axis = yAxis as { type?: string; axisLabel?: { width?: number } };
  const wanted = axis.axisLabel?.width;
  if (axis.type !== 'category' || wanted === undefined) return option;
  const room = Math.floor(width * LABEL_SHARE);
  if (!(room > 0) || wanted <= room) return option;
  return { ...option, yAxis: { ...axis, axisLabel: { ...axis.axisLabel, width: room } } };
}

/** The width given to the names down the side, if the option has such names (to tell whether a redraw changes them). */
export function labelWidthOf(option: EChartsCoreOption): number | undefined {
  const yAxis = (option as { yAxis?: { axisLabel?: { width?: number } } }).yAxis;
  return Array.isArray(yAxis) ? undefined : yAxis?.axisLabel?.width;
}
