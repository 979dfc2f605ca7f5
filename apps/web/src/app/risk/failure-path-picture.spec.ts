import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { describe, expect, it } from 'vitest';
import { PATH_BOX, layoutFailurePaths } from './failure-path-layout';
import { FailurePathPicture } from './failure-path-picture';
import { FAILURE_PATHS } from './risk-fixtures';

async function render(paths = FAILURE_PATHS): Promise<HTMLElement> {
  TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  const fixture = TestBed.createComponent(FailurePathPicture);
  fixture.componentRef.setInput('paths', paths);
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

describe('FailurePathPicture', () => {
  it('draws each distinct path node once and one line per distinct hop', async () => {
    const root = await render();
    // Two paths sharing their first three nodes: 7 distinct nodes, 6 distinct hops.
    const labels = [...root.querySelectorAll('.path-picture__label')].map((t) => t.textContent);
    expect(labels).toEqual([
      'S-2-SHARED-A', 'C-77 at S-1-004', 'S-1-004', 'H-10 at P-NORTH', 'F-100',
      'H-20 at P-NORTH', 'F-200',
    ]);
    expect(root.querySelectorAll('g.path-picture__node')).toHaveLength(7);
    expect(root.querySelectorAll('line.path-picture__edge')).toHaveLength(6);
    const origins = root.querySelectorAll('g.path-picture__node--origin .path-picture__label');
    expect([...origins].map((t) => t.textContent)).toEqual(['S-2-SHARED-A']);
  });

  it('places the supplier on the left and the products on the right by column', () => {
    const layout = layoutFailurePaths(FAILURE_PATHS);
    const x = Object.fromEntries(layout.nodes.map((node) => [node.label, node.x]));
    const step = PATH_BOX.width + PATH_BOX.columnGap;
    expect(x['S-2-SHARED-A']).toBe(PATH_BOX.margin);
    expect(x['S-1-004']).toBe(PATH_BOX.margin + 2 * step);
    expect(x['F-100']).toBe(PATH_BOX.margin + 4 * step);
    expect(x['F-200']).toBe(x['F-100']);
    // Both products share column 0, so the second sits one row lower.
    const y = Object.fromEntries(layout.nodes.map((node) => [node.label, node.y]));
    expect(y['F-200']! - y['F-100']!).toBe(PATH_BOX.height + PATH_BOX.rowGap);
  });

  it('describes the picture in words and lists every path', async () => {
    const root = await render();
    const svg = root.querySelector('svg')!;
    expect(svg.getAttribute('role')).toBe('img');
    expect(svg.getAttribute('aria-label')).toContain('to 2 products: 7 nodes and 6 links');
    const items = [...root.querySelectorAll('.path-picture__list li')].map((li) =>
      li.textContent?.trim());
    expect(items).toEqual([
      'To F-100: S-2-SHARED-A → C-77 at S-1-004 → S-1-004 → H-10 at P-NORTH → F-100',
      'To F-200: S-2-SHARED-A → C-77 at S-1-004 → S-1-004 → H-20 at P-NORTH → F-200',
    ]);
  });

  it('says so when the supplier stops no product', async () => {
    const root = await render([]);
    expect(root.querySelectorAll('g.path-picture__node')).toHaveLength(0);
    expect(root.querySelector('svg')?.getAttribute('aria-label')).toContain('No failure paths');
  });
});
