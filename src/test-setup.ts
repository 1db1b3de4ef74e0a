// jsdom lacks a few browser APIs that Material and the notation code touch; give them inert,
// honest stand-ins so specs exercise our logic rather than jsdom's gaps.

if (!('fonts' in document)) {
  Object.defineProperty(document, 'fonts', {
    configurable: true,
    value: { ready: Promise.resolve(), check: () => true, load: () => Promise.resolve([]) },
  });
}

// jsdom returns null from getContext (and logs "not implemented"); specs that need a real canvas
// belong in the browser journeys.
HTMLCanvasElement.prototype.getContext = (() =>
  null) as typeof HTMLCanvasElement.prototype.getContext;

if (!window.matchMedia) {
  window.matchMedia = (query: string): MediaQueryList =>
    ({
      matches: false,
      media: query,
      onchange: null,
      addListener: () => undefined,
      removeListener: () => undefined,
      addEventListener: () => undefined,
      removeEventListener: () => undefined,
      dispatchEvent: () => false,
    }) as MediaQueryList;
}
