// The network half of the configuration: TLS files, the reverse proxy to trust, the public
// address and the WebSocket origins the page may reach. Parsed here so config.ts stays a list.
import fs from 'node:fs';
import { isIP } from 'node:net';
import { z } from 'zod';

export interface TlsFiles {
  certFile: string;
  keyFile: string;
  cert: Buffer;
  key: Buffer;
}

/** Express's `trust proxy`: off, a hop count, or the proxies' addresses (IP, CIDR or loopback…). */
export type TrustProxy = false | number | string[];

const PROXY_NAMES = new Set(['loopback', 'linklocal', 'uniquelocal']);

function isAddressOrSubnet(text: string): boolean {
  if (PROXY_NAMES.has(text)) return true;
  const [addr, bits, extra] = text.split('/');
  if (extra !== undefined || !isIP(addr)) return false;
  if (bits === undefined) return true;
  const max = isIP(addr) === 4 ? 32 : 128;
  return /^\d{1,3}$/.test(bits) && Number(bits) <= max;
}

export const trustProxySchema = z
  .string()
  .trim()
  .transform((text, ctx): TrustProxy => {
    if (/^(off|false|0)$/i.test(text)) return false;
    if (/^\d+$/.test(text)) return Number(text);
    const list = text.split(',').map((s) => s.trim()).filter(Boolean);
    const bad = list.filter((a) => !isAddressOrSubnet(a));
    if (list.length === 0 || bad.length > 0) {
      ctx.addIssue({ code: 'custom', message: `must be off, a hop count (1) or a comma-separated list of proxy addresses (10.0.0.5, 10.0.0.0/8, loopback); not ${bad.map((b) => JSON.stringify(b)).join(', ') || 'empty'}` });
      return z.NEVER;
    }
    return list;
  });

export const publicUrlSchema = z
  .string()
  .trim()
  .transform((text, ctx) => {
    let u: URL;
    try {
      u = new URL(text);
    } catch {
      ctx.addIssue({ code: 'custom', message: 'must be an address such as https://lab-server.example:3000' });
      return z.NEVER;
    }
    if (!/^https?:$/.test(u.protocol) || u.search || u.hash || u.username) {
      ctx.addIssue({ code: 'custom', message: 'must be an http:// or https:// address without query, fragment or user' });
      return z.NEVER;
    }
    return u.href.replace(/\/+$/, '');
  });

// A CSP host-source limited to WebSocket origins: scheme, host (or *.domain, or [IPv6]), optional
// port or port wildcard, nothing after.
const WS_ORIGIN = /^wss?:\/\/(\*\.)?([a-z0-9-]+(\.[a-z0-9-]+)*|\[[0-9a-f:.]+\])(:(\d{1,5}|\*))?\/?$/i;

export const bridgeOriginsSchema = z
  .string()
  .transform((text, ctx) => {
    const list = text.split(',').map((s) => s.trim()).filter(Boolean);
    const bad = list.filter((o) => !WS_ORIGIN.test(o));
    if (bad.length > 0) {
      ctx.addIssue({ code: 'custom', message: `must be comma-separated ws:// or wss:// origins (wss://bay3-pc.lab:5176, ws://127.0.0.1:*); not ${bad.map((b) => JSON.stringify(b)).join(', ')}` });
      return z.NEVER;
    }
    return list.map((o) => o.replace(/\/$/, ''));
  });

/**
 * Read the certificate and key named by TLS_CERT_FILE and TLS_KEY_FILE: both or neither. Returns
 * the problems found (for ConfigError) instead of throwing, so they are listed with the others.
 */
export function readTlsFiles(certFile: string | undefined, keyFile: string | undefined): { tls?: TlsFiles; issues: string[] } {
  if (!certFile && !keyFile) return { issues: [] };
  if (!certFile || !keyFile) return { issues: [`TLS_CERT_FILE and TLS_KEY_FILE: set both for HTTPS, or neither for plain http (only ${certFile ? 'TLS_CERT_FILE' : 'TLS_KEY_FILE'} is set)`] };
  const issues: string[] = [];
  const read = (name: string, file: string, marker: RegExp, what: string) => {
    try {
      const data = fs.readFileSync(file);
      if (!marker.test(data.toString('latin1'))) issues.push(`${name}: ${file} is not a PEM ${what} (no "-----BEGIN ${what.toUpperCase()}-----" line)`);
      return data;
    } catch (err) {
      issues.push(`${name}: cannot read ${file} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
      return Buffer.alloc(0);
    }
  };
  const cert = read('TLS_CERT_FILE', certFile, /-----BEGIN CERTIFICATE-----/, 'certificate');
  const key = read('TLS_KEY_FILE', keyFile, /-----BEGIN [A-Z ]*PRIVATE KEY-----/, 'private key');
  return issues.length ? { issues } : { tls: { certFile, keyFile, cert, key }, issues };
}
