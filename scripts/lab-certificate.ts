// A self-signed certificate for a lab server, made with the system's `openssl`: the host names
// and addresses people type become its subjectAltName (browsers ignore the CN). Used by
// `npm run cert` (scripts/cert.ts) and by the HTTPS tests.
import { spawnSync } from 'node:child_process';
import { X509Certificate } from 'node:crypto';
import fs from 'node:fs';
import { isIP } from 'node:net';
import path from 'node:path';

export interface LabCertificate {
  certFile: string;
  keyFile: string;
  /** SHA-256 of the DER certificate, colon-separated hex, as browsers show it. */
  fingerprint: string;
  hosts: string[];
  days: number;
}

export interface LabCertificateOptions {
  hosts: string[];
  outDir: string;
  /** Validity; 825 days is the longest most browsers accept for a server certificate (common practice, no source). */
  days?: number;
  /** Replace files already there. */
  force?: boolean;
  /** The openssl program (tests point it elsewhere to see the missing-program message). */
  openssl?: string;
}

export class CertificateError extends Error {}

const HOST_NAME = /^(?=.{1,253}$)(\*\.)?[a-z0-9]([a-z0-9-]{0,61}[a-z0-9])?(\.[a-z0-9]([a-z0-9-]{0,61}[a-z0-9])?)*$/i;

/** subjectAltName entries: IP addresses as IP:, names as DNS:. */
export function subjectAltName(hosts: string[]): string {
  return hosts.map((h) => (isIP(h) ? `IP:${h}` : `DNS:${h}`)).join(',');
}

export function makeLabCertificate({ hosts, outDir, days = 825, force = false, openssl = 'openssl' }: LabCertificateOptions): LabCertificate {
  if (hosts.length === 0) throw new CertificateError('name at least one --host: the name or address people type to reach the server');
  const bad = hosts.filter((h) => !isIP(h) && !HOST_NAME.test(h));
  if (bad.length) throw new CertificateError(`not a host name or IP address: ${bad.join(', ')}`);
  if (!Number.isInteger(days) || days < 1 || days > 3650) throw new CertificateError(`--days must be a whole number from 1 to 3650, got ${days}`);
  const certFile = path.resolve(outDir, 'cert.pem');
  const keyFile = path.resolve(outDir, 'key.pem');
  const existing = [certFile, keyFile].filter((f) => fs.existsSync(f));
  if (existing.length && !force) throw new CertificateError(`${existing.join(' and ')} already there: choose another --out, or add --force to replace`);
  fs.mkdirSync(outDir, { recursive: true });

  const cn = hosts.find((h) => !isIP(h)) ?? hosts[0];
  const result = spawnSync(
    openssl,
    [
      'req', '-x509', '-newkey', 'ec', '-pkeyopt', 'ec_paramgen_curve:prime256v1', '-nodes', '-sha256',
      '-days', String(days), '-subj', `/CN=${cn}/O=Anglebench lab server`,
      '-keyout', keyFile, '-out', certFile,
      '-addext', `subjectAltName=${subjectAltName(hosts)}`,
      '-addext', 'basicConstraints=critical,CA:FALSE',
      '-addext', 'keyUsage=critical,digitalSignature',
      '-addext', 'extendedKeyUsage=serverAuth',
    ],
    { encoding: 'utf8' },
  );
  if (result.error) {
    const missing = (result.error as NodeJS.ErrnoException).code === 'ENOENT';
    throw new CertificateError(missing ? `${openssl} was not found: install OpenSSL (on Debian or Ubuntu: sudo apt install openssl) and run this again` : `could not run ${openssl}: ${result.error.message}`);
  }
  if (result.status !== 0) throw new CertificateError(`openssl failed (exit ${result.status}):\n${result.stderr.trim()}`);
  fs.chmodSync(keyFile, 0o600);
  const fingerprint = new X509Certificate(fs.readFileSync(certFile)).fingerprint256;
  return { certFile, keyFile, fingerprint, hosts, days };
}
