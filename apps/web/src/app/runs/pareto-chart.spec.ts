import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { ParetoDto } from '@keelson/contracts';
import type { Chart } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';
import { describe, expect, it } from 'vitest';
import { PARETO_TOP, ParetoChart } from './pareto-chart';

/** 40 invented suppliers whose impact halves every ten places. */
function pareto(): ParetoDto {
  const impacts = Array.from({ length: 40 }, (_, index) => 1000 * 0.5 ** Math.floor(index / 10));
  const total = impacts.reduce((sum, impact) => sum + impact, 0);
  let running = 0;
  return {
    items: impacts.map((revenueImpact, index) => {
      running += revenueImpact;
      return { code: `S-${index + 1}`, name: `Supplier ${index + 1}`, revenueImpact,
        cumulativeShare: running / total };
    }),
    totalRevenueImpact: total,
  };
}

describe('ParetoChart', () => {
  async function render(data: ParetoDto): Promise<{ root: HTMLElement; chart?: Chart }> {
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
    const fixture = TestBed.createComponent(ParetoChart);
    fixture.componentRef.setInput('pareto', data);
    await fixture.whenStable();
    fixture.detectChanges();
    const directive = fixture.debugElement.children
      .map((child) => child.injector.get(BaseChartDirective, null))
      .find((candidate) => candidate !== null);
    const canvas = fixture.debugElement.query((node) => node.name === 'canvas');
    return {
      root: fixture.nativeElement as HTMLElement,
      chart: (canvas?.injector.get(BaseChartDirective).chart ?? directive?.chart) as
        Chart | undefined,
    };
  }

  it('draws the top 30 as bars with the cumulative share as a line on a 0-100 % axis',
    async () => {
      const { root, chart } = await render(pareto());
      // 10 x 1000 + 10 x 500 + 10 x 250 of 18 750 in all.
      expect(root.textContent).toContain('The 30 suppliers with the largest revenue impact ' +
        'carry 93.3% of the run\'s total of 18,750.');
      expect(chart).toBeDefined();
      expect(chart!.data.labels).toHaveLength(PARETO_TOP);
      const [bars, line] = chart!.data.datasets;
      expect(bars!.data[0]).toBe(1000);
      expect(bars!.data[29]).toBe(250);
      expect(line!.data[29]).toBe(93.3);
      expect(chart!.options.scales?.['share']?.max).toBe(100);
      expect(root.querySelector('canvas')?.getAttribute('aria-label')).toBe(
        'Revenue impact of the top 30 suppliers, with the cumulative share reaching 93 %.',
      );
    });

  it('says so when no supplier has any revenue impact', async () => {
    const { root } = await render({ items: [], totalRevenueImpact: 0 });
    expect(root.querySelector('canvas')).toBeNull();
    expect(root.textContent).toContain('No supplier of this run has any revenue impact.');
  });
});
