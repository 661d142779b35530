import helmet from 'helmet';

/**
 * helmet with a strict Content-Security-Policy: everything from our own origin, nothing from
 * anywhere else. Inline styles are allowed because Angular Material sets them; inline scripts
 * are not. `upgrade-insecure-requests` is left out: the product is served over plain http on
 * localhost.
 */
export function securityHeaders() {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        scriptSrcAttr: ["'none'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        fontSrc: ["'self'"],
        imgSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        objectSrc: ["'none'"],
        frameAncestors: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
      },
    },
    xFrameOptions: { action: 'deny' },
    // Plain http on localhost: telling browsers to insist on https would lock people out.
    strictTransportSecurity: false,
  });
}
