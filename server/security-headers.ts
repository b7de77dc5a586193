import helmet from 'helmet';

/**
 * helmet with a Content Security Policy fitted to the client: its own scripts only; inline
 * styles because uPlot positions its cursor and legend with style attributes; WebSocket
 * connections to a simulated board or bench bridge on this machine; Web Workers from blob: URLs
 * (the decoding worker). No upgrade-insecure-requests, so plain http on localhost keeps working.
 */
export function securityHeaders() {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: true,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        connectSrc: ["'self'", 'ws://127.0.0.1:*', 'ws://localhost:*'],
        workerSrc: ["'self'", 'blob:'],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'", 'data:'],
        upgradeInsecureRequests: null,
      },
    },
  });
}
