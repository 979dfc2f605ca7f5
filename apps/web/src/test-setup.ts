/**
 * Test setup for the client's unit tests under jsdom: stubs what Chart.js and Material's layout
 * code expect from a real browser (a 2D canvas context, ResizeObserver, matchMedia), so
 * components that draw charts can be created in tests. The native `canvas` package is not used
 * because it downloads a binary at install.
 */

/** A 2D context whose drawing calls do nothing and whose measurements are zero. */
function stubContext2d(canvas: HTMLCanvasElement): CanvasRenderingContext2D {
  const noop = (): void => undefined;
  const target: Record<string | symbol, unknown> = {
    canvas,
    measureText: (text: string) => ({ width: text.length * 6 }) as TextMetrics,
    getImageData: () => ({ data: new Uint8ClampedArray(4) }),
    createLinearGradient: () => ({ addColorStop: noop }),
    createRadialGradient: () => ({ addColorStop: noop }),
    createPattern: () => null,
    getLineDash: () => [],
    getTransform: () => ({ a: 1, b: 0, c: 0, d: 1, e: 0, f: 0 }),
  };
  return new Proxy(target, {
    get: (object, key) => (key in object ? object[key] : noop),
    set: (object, key, value) => {
      object[key] = value;
      return true;
    },
  }) as unknown as CanvasRenderingContext2D;
}

Object.defineProperty(HTMLCanvasElement.prototype, 'getContext', {
  configurable: true,
  writable: true,
  value(this: HTMLCanvasElement, kind: string) {
    return kind === '2d' ? stubContext2d(this) : null;
  },
});

if (!('ResizeObserver' in globalThis)) {
  class ResizeObserverStub implements ResizeObserver {
    observe(): void {}
    unobserve(): void {}
    disconnect(): void {}
  }
  Object.defineProperty(globalThis, 'ResizeObserver', {
    configurable: true,
    writable: true,
    value: ResizeObserverStub,
  });
}

if (typeof window.matchMedia !== 'function') {
  Object.defineProperty(window, 'matchMedia', {
    configurable: true,
    writable: true,
    value: (query: string): MediaQueryList =>
      ({
        matches: false,
        media: query,
        onchange: null,
        addListener: () => undefined,
        removeListener: () => undefined,
        addEventListener: () => undefined,
        removeEventListener: () => undefined,
        dispatchEvent: () => false,
      }) as MediaQueryList,
  });
}
