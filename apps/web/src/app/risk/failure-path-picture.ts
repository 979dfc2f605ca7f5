import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { PathNodeDto } from '@keelson/contracts';
import { PATH_BOX, layoutFailurePaths, pathNodeLabel } from './failure-path-layout';

/** Characters of a label that fit in a box; longer ones are cut, the full text in a tooltip. */
const LABEL_FIT = 20;

/**
 * The failure paths of one supplier as a small tiered SVG: the supplier on the left, the
 * products it would stop on the right, every node once and one arrow per hop. For screen
 * readers the SVG has a text description, and the same paths follow as a list.
 */
@Component({
  selector: 'kl-failure-path-picture',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './failure-path-picture.html',
  styleUrl: './failure-path-picture.scss',
})
export class FailurePathPicture {
  /** One path per lost product, supplier first, product last. */
  readonly paths = input.required<readonly { product: string; nodes: PathNodeDto[] }[]>();

  protected readonly box = PATH_BOX;
  protected readonly layout = computed(() => layoutFailurePaths(this.paths()));
  protected readonly description = computed(() => {
    const paths = this.paths();
    const { nodes, edges } = this.layout();
    if (paths.length === 0) return 'No failure paths: this supplier stops no product.';
    const first = paths[0]!.nodes[0];
    return `Failure paths from ${first ? pathNodeLabel(first) : 'the supplier'} to ` +
      `${paths.length} product${paths.length === 1 ? '' : 's'}: ${nodes.length} nodes and ` +
      `${edges.length} links. The list below gives each path in words.`;
  });
  protected readonly pathTexts = computed(() =>
    this.paths().map((path) => ({
      product: path.product,
      text: path.nodes.map(pathNodeLabel).join(' → '),
    })),
  );

  protected fit(label: string): string {
    return label.length <= LABEL_FIT ? label : `${label.slice(0, LABEL_FIT - 1)}…`;
  }
}
