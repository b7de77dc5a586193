// What this browser can connect through, and where the server's own simulated board is.
import { hasWebSerial } from './web-serial-link';

export type SerialSupport = { available: true } | { available: false; reason: string };

export interface BrowserFacts {
  /** window.isSecureContext: HTTPS, or http on localhost. */
  secureContext: boolean;
  /** navigator.serial exists. */
  hasSerial: boolean;
}

/**
 * Whether the serial option can work here and, when not, why in one sentence with what to do.
 * Web Serial exists only in a secure context (WICG Web Serial draft, "SecureContext"), so over
 * plain http from another machine even a browser that has it shows none.
 */
export function serialSupport({ secureContext, hasSerial }: BrowserFacts): SerialSupport {
  if (!secureContext) {
    return {
      available: false,
      reason: 'This page came over plain http, where browsers give no Web Serial: open the team’s https:// address of Anglebench, or use a station or the simulated board.',
    };
  }
  if (!hasSerial) {
    return {
      available: false,
      reason: 'This browser has no Web Serial: open this page in a desktop browser that has it (Chrome, Edge or another Chromium-based one), or use a station or the simulated board.',
    };
  }
  return { available: true };
}

/** The facts of the running browser. */
export const browserFacts = (): BrowserFacts => ({
  secureContext: window.isSecureContext,
  hasSerial: hasWebSerial(),
});

/** The path of the server-hosted simulated boards (server/sockets/sim-boards.ts). */
export const HOSTED_BOARD_PATH = '/api/sim-board';

/** A WebSocket address on the server this page came from: wss: under HTTPS, ws: under http. */
export function sameOriginSocketUrl(location: Pick<Location, 'protocol' | 'host'>, path: string): string {
  return `${location.protocol === 'https:' ? 'wss:' : 'ws:'}//${location.host}${path}`;
}

/** The hosted board on the server this page came from. */
export const hostedBoardUrl = (location: Pick<Location, 'protocol' | 'host'>) => sameOriginSocketUrl(location, HOSTED_BOARD_PATH);

/** What a hosted board address says about the link: the core it names (`?core=<slug or id>`) and a `baud=` of its own. */
export function hostedBoardCore(address: string): { core: string | null; baud: number | null } {
  let query: URLSearchParams;
  try {
    query = new URL(address).searchParams;
  } catch {
    return { core: null, baud: null };
  }
  const baud = Number(query.get('baud'));
  return { core: query.get('core'), baud: query.has('baud') && Number.isInteger(baud) ? baud : null };
}

/** The address of the hosted board that serves `coreSlug` (its mode, configuration and link profile); null: the default rotating core. */
export const hostedBoardUrlFor = (location: Pick<Location, 'protocol' | 'host'>, coreSlug: string | null) =>
  hostedBoardUrl(location) + (coreSlug ? `?core=${encodeURIComponent(coreSlug)}` : '');
