/**
 * The one place that talks to cytoscape: draws a network picture into an element with a
 * layered layout (dagre for small pictures, {@link layeredPositions} in the server's columns for
 * larger ones), styles nodes by kind and single-point flag, and hands back a small handle for
 * focusing, zooming and tearing down. cytoscape and its dagre layout are imported on
 * first use, so they land in their own lazy chunk; specs replace this service with a fake.
 */
import { Injectable } from '@angular/core';
import type { Core, ElementDefinition, LayoutOptions, StylesheetJson } from 'cytoscape';
import { layeredPositions } from './layered-positions';
import type { NetworkPicture, NetworkPictureNode } from './network-picture-dto';

/**
 * Nodes up to which the dagre layout runs; above it {@link layeredPositions} places them in the
 * server's columns. Dagre took about 2 s for 400 nodes and 6 s for the demo's 900 (Node 20,
 * headless cytoscape), too long to block the page for.
 */
export const DAGRE_NODE_LIMIT = 300;

/** What a drawn picture can do. */
export interface PictureHandle {
  /** Centres and zooms on a node and selects it; false when there is no such node. */
  focus(id: string): boolean;
  /** Zooms in (factor above 1) or out around the centre. */
  zoomBy(factor: number): void;
  /** Fits the whole picture into view. */
  fit(): void;
  /** Removes the picture and its listeners. */
  destroy(): void;
}

/** Callbacks of a drawn picture. */
export interface PictureEvents {
  /** A node was tapped or clicked. */
  nodeSelected(node: NetworkPictureNode): void;
}

// Fixed colours: cytoscape draws on a canvas and cannot read the theme's CSS variables. They
// follow the light theme's palette and stay readable on the dark one.
const COLOURS = {
  plant: '#34495e',
  product: '#1f5fa8',
  item: '#9aa5b1',
  supplier: '#4f8a8b',
  group: '#6c7a89',
  single: '#c62828',
  edge: '#b0b8c1',
  label: '#1b1f24',
} as const;

const STYLE: StylesheetJson = [
  {
    selector: 'node',
    style: {
      'background-color': COLOURS.supplier,
      label: 'data(label)',
      'font-size': 11,
      color: COLOURS.label,
      'text-valign': 'bottom',
      'text-margin-y': 3,
      'text-background-color': '#ffffff',
      'text-background-opacity': 0.75,
      'text-background-padding': '1px',
      'min-zoomed-font-size': 7,
      width: 18,
      height: 18,
    },
  },
  { selector: 'node[kind = "plant"]', style: { shape: 'round-rectangle', width: 34, height: 22,
    'background-color': COLOURS.plant } },
  { selector: 'node[kind = "product"]', style: { shape: 'round-rectangle', width: 26,
    height: 18, 'background-color': COLOURS.product } },
  { selector: 'node[kind = "item"]', style: { width: 8, height: 8, label: '',
    'background-color': COLOURS.item } },
  { selector: 'node[kind = "supplierGroup"]', style: { shape: 'hexagon',
    'background-color': COLOURS.group, width: 'data(size)', height: 'data(size)' } },
  { selector: 'node[?isSinglePoint]', style: { 'background-color': COLOURS.single,
    'border-width': 3, 'border-color': '#7f0000' } },
  { selector: 'node:selected', style: { 'border-width': 4, 'border-color': '#f9a825' } },
  {
    selector: 'edge',
    style: {
      width: 1,
      'line-color': COLOURS.edge,
      'target-arrow-color': COLOURS.edge,
      'target-arrow-shape': 'triangle',
      'arrow-scale': 0.6,
      'curve-style': 'bezier',
    },
  },
  { selector: 'edge[count > 1]', style: { width: 'mapData(count, 1, 200, 1, 8)' } },
];

function elements(picture: NetworkPicture): ElementDefinition[] {
  const positions = picture.nodes.length > DAGRE_NODE_LIMIT
    ? layeredPositions(picture.nodes, picture.edges)
    : null;
  const nodes: ElementDefinition[] = picture.nodes.map((node) => ({
    group: 'nodes',
    data: { ...node, size: 16 + 6 * Math.sqrt(node.count ?? 1) },
    ...(positions ? { position: positions.get(node.id)! } : {}),
  }));
  const edges: ElementDefinition[] = picture.edges.map((edge, i) => ({
    group: 'edges',
    data: { id: `e${i}`, source: edge.source, target: edge.target, count: edge.count ?? 1 },
  }));
  return [...nodes, ...edges];
}

/** Draws network pictures with cytoscape (see the file header). */
@Injectable({ providedIn: 'root' })
export class NetworkPictureRenderer {
  /** Draws `picture` into `container`, replacing nothing: destroy the previous handle first. */
  async render(
    container: HTMLElement,
    picture: NetworkPicture,
    events: PictureEvents,
  ): Promise<PictureHandle> {
    const [{ default: cytoscape }, { default: dagre }] = await Promise.all([
      import('cytoscape'),
      import('cytoscape-dagre'),
    ]);
    cytoscape.use(dagre);
    const isLarge = picture.nodes.length > DAGRE_NODE_LIMIT;
    const layout = (isLarge
      ? { name: 'preset', fit: true, padding: 24 }
      : { name: 'dagre', rankDir: 'LR', ranker: 'longest-path', nodeSep: 12, rankSep: 90,
        fit: true, padding: 24 }) as LayoutOptions;
    const cy: Core = cytoscape({
      container,
      elements: elements(picture),
      style: STYLE,
      layout,
      minZoom: 0.05,
      maxZoom: 4,
      wheelSensitivity: 0.3,
      boxSelectionEnabled: false,
    });
    cy.on('tap', 'node', (event) => {
      events.nodeSelected(event.target.data() as NetworkPictureNode);
    });
    return {
      focus(id) {
        const node = cy.getElementById(id);
        if (node.empty()) return false;
        cy.elements().unselect();
        node.select();
        cy.animate({ center: { eles: node }, zoom: Math.max(cy.zoom(), 1.2) }, { duration: 250 });
        return true;
      },
      zoomBy(factor) {
        const { width, height } = { width: cy.width(), height: cy.height() };
        cy.zoom({ level: cy.zoom() * factor, renderedPosition: { x: width / 2, y: height / 2 } });
      },
      fit() {
        cy.fit(undefined, 24);
      },
      destroy() {
        cy.destroy();
      },
    };
  }
}
