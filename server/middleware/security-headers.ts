import helmet from 'helmet';
import type { RequestHandler } from 'express';

/** Helmet with a Content-Security-Policy for the Vite-built client: only
 * same-origin scripts and styles (the build emits files, no inline code).
 * React's `style` props are applied through the CSSOM, which CSP does not
 * restrict, so no 'unsafe-inline' is needed. */
export function securityHeaders(options: { production: boolean }): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        baseUri: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        workerSrc: ["'self'", 'blob:'],
        frameSrc: ["'self'", 'blob:'],
        objectSrc: ["'none'"],
        frameAncestors: ["'self'"],
        formAction: ["'self'"],
        ...(options.production ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    // HSTS over plain-HTTP local runs would pin browsers to HTTPS for localhost.
    strictTransportSecurity: options.production,
  });
}
