import { describe, expect, it } from 'vitest';
import { zAgainstTargetOption } from './review-chart-options';
import { LABEL_SHARE, labelWidthOf, withLabelRoom } from './label-room';

describe('room for category names down the side of a chart', () => {
  const option = zAgainstTargetOption([
    {
      processId: 'p1',
      process: 'A process with a name long enough to fill a phone',
      site: 'Site',
      status: 'short',
      zLevel: 2.1,
      requiredZ: 4,
      zGap: -1.9
    } as never
  ]);

  it('narrows the names to a share of a phone-sized chart and leaves the rest of the option as it was', () => {
    const narrow = withLabelRoom(option, 330);
    expect(labelWidthOf(narrow)).toBe(Math.floor(330 * LABEL_SHARE));
    expect(labelWidthOf(option)).toBe(260);
    expect({ ...narrow, yAxis: undefined }).toEqual({ ...option, yAxis: undefined });
  });

  it('leaves a wide chart, and charts without names down the side, untouched', () => {
    expect(withLabelRoom(option, 1200)).toBe(option);
    const columns = { xAxis: { type: 'category' }, yAxis: { type: 'value' } };
    expect(withLabelRoom(columns, 300)).toBe(columns);
    expect(labelWidthOf(columns)).toBeUndefined();
  });
});
