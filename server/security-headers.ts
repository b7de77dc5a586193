import type { RequestHandler } from 'express';
import helmet from 'helmet';
import type { Config } from './config';

/** One year, the usual HSTS lifetime (common practice, no source). */
const HSTS_SECONDS = 365 * 24 * 60 * 60;

/**
 * The CSP's connect-src: the page's own origin, which in CSP Level 3 also covers ws:/wss: to
 * the same host and port (the hosted simulated boards, stations), plus the bench bridges the lab
 * lists in BRIDGE_ORIGINS. Never a fixed localhost list: a bridge is only reachable if configured.
 */
export function connectSources(config: Pick<Config, 'bridgeOrigins'>): string[] {
  return ["'self'", ...config.bridgeOrigins];
}

/**
 * helmet with a Content Security Policy fitted to the client: its own scripts only; inline
 * styles because uPlot positions its cursor and legend with style attributes; connections as
 * connectSources says; Web Workers from blob: URLs (the decoding worker). No
 * upgrade-insecure-requests, so plain http on localhost keeps working. HSTS only on requests
 * that came over HTTPS (directly or through a trusted proxy): sent over plain http it would be
 * ignored at best, and would lock a lab out of a server without TLS at worst.
 */
export function securityHeaders(config: Pick<Config, 'bridgeOrigins'>): RequestHandler[] {
  const headers = helmet({
    strictTransportSecurity: false,
    contentSecurityPolicy: {
      useDefaults: true,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        connectSrc: connectSources(config),
        workerSrc: ["'self'", 'blob:'],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'", 'data:'],
        upgradeInsecureRequests: null,
      },
    },
  });
  const hsts: RequestHandler = (req, res, next) => {
    if (req.secure) res.setHeader('Strict-Transport-Security', `max-age=${HSTS_SECONDS}`);
    next();
  };
  return [headers, hsts];
}
