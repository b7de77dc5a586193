// `npm run cert -- --host lab-server [--host 10.0.0.5] [--out DIR] [--days N] [--force]`
import path from 'node:path';
import { parseArgs } from 'node:util';
import { dataDir } from '../server/paths';
import { CertificateError, makeLabCertificate } from './lab-certificate';

const USAGE = `usage: npm run cert -- --host NAME [--host NAME|IP …] [--out DIR] [--days 825] [--force]
  Makes a self-signed certificate (cert.pem, key.pem) for the lab server with the system's openssl.
  --host   a name or address people type to reach the server (repeat, or separate with commas)
  --out    where to write the files (default ${path.relative(process.cwd(), path.join(dataDir, 'tls')) || '.'})`;

try {
  const { values } = parseArgs({
    args: process.argv.slice(2),
    strict: true,
    options: {
      host: { type: 'string', multiple: true },
      out: { type: 'string' },
      days: { type: 'string' },
      force: { type: 'boolean' },
      help: { type: 'boolean', short: 'h' },
    },
  });
  if (values.help) {
    console.log(USAGE);
    process.exit(0);
  }
  const hosts = (values.host ?? []).flatMap((h) => h.split(',')).map((h) => h.trim()).filter(Boolean);
  const made = makeLabCertificate({
    hosts,
    outDir: values.out ?? path.join(dataDir, 'tls'),
    days: values.days === undefined ? undefined : Number(values.days),
    force: values.force,
  });
  console.log(`Self-signed certificate for ${made.hosts.join(', ')}, valid ${made.days} days:
  certificate  ${made.certFile}
  private key  ${made.keyFile} (readable by you only: keep it on the server)

SHA-256 fingerprint (compare it with what the browser shows before you accept the certificate):
  ${made.fingerprint}

To serve HTTPS, set these two variables before npm start:
  TLS_CERT_FILE=${made.certFile}
  TLS_KEY_FILE=${made.keyFile}

Browsers warn about a self-signed certificate until it is trusted: import cert.pem into each
browser's or machine's trusted certificates, as your lab's rules allow (see docs/deploy.md).`);
} catch (err) {
  const known = err instanceof CertificateError || (err as NodeJS.ErrnoException).code?.startsWith('ERR_PARSE_ARGS');
  console.error(`cert: ${(err as Error).message}${known ? `\n${USAGE}` : ''}`);
  process.exit(2);
}
