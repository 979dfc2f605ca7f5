import type { RequestHandler } from 'express';
import helmet from 'helmet';

/**
 * helmet with a Content-Security-Policy that allows this origin only: the client ships its own
 * scripts, styles and fonts. Inline styles stay allowed because Angular components and Material
 * set style attributes at run time; inline scripts and every other origin are refused. HSTS and
 * upgrade-insecure-requests are sent only when the public address is https.
 */
export function securityHeaders(isHttps: boolean): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        baseUri: ["'self'"],
        scriptSrc: ["'self'"],
        scriptSrcAttr: ["'none'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        fontSrc: ["'self'"],
        imgSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        objectSrc: ["'none'"],
        frameSrc: ["'self'"],
        frameAncestors: ["'none'"],
        formAction: ["'self'"],
        ...(isHttps ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    strictTransportSecurity: isHttps ? { maxAge: 15_552_000, includeSubDomains: true } : false,
    crossOriginEmbedderPolicy: false,
    frameguard: { action: 'deny' },
    referrerPolicy: { policy: 'same-origin' },
  });
}
