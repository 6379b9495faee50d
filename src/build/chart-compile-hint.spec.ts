import { describe, expect, it } from 'vitest';
import { chartCompileHint, COMPILE_ALL_HINT } from './chart-compile-hint';

type Hook = (options: unknown, bundle: Record<string, unknown>) => void;

describe('the chart compile hint', () => {
  it("is written at the top of the chart library's chunk only, after minifying", () => {
    const chunk = (moduleIds: string[], code: string) => ({ type: 'chunk', moduleIds, code });
    const bundle = {
      'charts.js': chunk(['/app/node_modules/zrender/lib/core/platform.js'], 'var a=1;'),
      'echarts.js': chunk(['C:\\app\\node_modules\\echarts\\lib\\core\\echarts.js'], 'var b=2;'),
      'page.js': chunk(['/app/src/routes/+page.svelte'], 'var c=3;'),
      'style.css': { type: 'asset', source: 'a{}' }
    };
    (chartCompileHint().generateBundle as unknown as Hook)({}, bundle);
    expect(bundle['charts.js'].code).toBe(`${COMPILE_ALL_HINT}\nvar a=1;`);
    expect(bundle['echarts.js'].code).toBe(`${COMPILE_ALL_HINT}\nvar b=2;`);
    expect(bundle['page.js'].code).toBe('var c=3;');
  });
});
