import helmet from 'helmet';
import type { RequestHandler } from 'express';

/**
 * helmet with a Content Security Policy that allows only this origin, plus:
 * - `data:` for fonts and images (the notation font is embedded as data: URLs);
 * - `blob:` for audio worklets and workers (the audio library loads its worklet and timing
 *   worker from blob: URLs), generated PDFs and audio buffers;
 * - `'unsafe-inline'` for styles only, which the component library's runtime styles need.
 * Scripts never run inline.
 */
export function securityHeaders(options: { https: boolean }): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'", 'blob:'],
        scriptSrcAttr: ["'none'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        mediaSrc: ["'self'", 'data:', 'blob:'],
        workerSrc: ["'self'", 'blob:'],
        frameSrc: ["'self'", 'blob:'],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(options.https ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    // Same-origin only; the app embeds nothing from elsewhere.
    crossOriginEmbedderPolicy: false,
    strictTransportSecurity: options.https,
  });
}
