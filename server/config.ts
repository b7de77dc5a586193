import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { z } from 'zod';
import { bridgeOriginsSchema, publicUrlSchema, readTlsFiles, trustProxySchema, type TlsFiles, type TrustProxy } from './network-config';
import { dataDir } from './paths';

const port = z.coerce.number().int().min(0).max(65535);

const databaseUrl = z
  .string()
  .refine((u) => u === 'sqlite::memory:' || u.startsWith('sqlite:') || /^postgres(ql)?:\/\//.test(u), {
    message: 'must be sqlite::memory:, sqlite:<file> or postgres://…',
  });

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: port.default(3000),
  HOST: z.string().default('127.0.0.1'),
  DATABASE_URL: databaseUrl.default(`sqlite:${path.join(dataDir, 'anglebench.sqlite')}`),
  SMTP_URL: z.url({ protocol: /^smtps?$/ }).optional(),
  MOCK_WS_PORT: port.default(5175),
  SESSION_SECRET: z.string().min(16, 'must be at least 16 characters').optional(),
  UPLOAD_LIMIT_BYTES: z.coerce.number().int().min(1).default(64 * 1024 * 1024),
  UPLOAD_DIR: z.string().default(path.join(dataDir, 'uploads')),
  DEMO_PASSWORD: z.string().min(8, 'must be at least 8 characters').optional(),
  TLS_CERT_FILE: z.string().optional(),
  TLS_KEY_FILE: z.string().optional(),
  TRUST_PROXY: trustProxySchema.default(false),
  PUBLIC_URL: publicUrlSchema.optional(),
  SIM_BOARDS_MAX: z.coerce.number().int().min(0).max(256).default(8),
  BRIDGE_ORIGINS: bridgeOriginsSchema.default([]),
});

export interface Config {
  nodeEnv: 'development' | 'production' | 'test';
  port: number;
  host: string;
  databaseUrl: string;
  smtpUrl?: string;
  mockWsPort: number;
  sessionSecret: string;
  /** Largest file of one upload accepted (session samples or archive, import, bitstream, golden vectors), in bytes (413 beyond). */
  uploadLimitBytes: number;
  /** Where bitstreams are kept; it belongs to one database, as build ids name the files. */
  uploadDir: string;
  /** The demo accounts' password (`anglebench` when unset). */
  demoPassword: string;
  /** HTTPS on PORT with this certificate and key (TLS_CERT_FILE, TLS_KEY_FILE); plain http without. */
  tls?: TlsFiles;
  /** Express's `trust proxy` for a reverse proxy that ends TLS (TRUST_PROXY; off by default). */
  trustProxy: TrustProxy;
  /** The address people use (PUBLIC_URL), for links in e-mail and the runner's output. */
  publicUrl?: string;
  /** Server-hosted simulated boards open at once (SIM_BOARDS_MAX, default 8; 0 turns them off). */
  simBoardsMax: number;
  /** WebSocket origins of bench bridges the page may reach (BRIDGE_ORIGINS), for the CSP. */
  bridgeOrigins: string[];
}

export class ConfigError extends Error {
  constructor(readonly issues: string[]) {
    super(`Invalid configuration:\n${issues.map((i) => `  - ${i}`).join('\n')}`);
    this.name = 'ConfigError';
  }
}

/**
 * Read and validate the configuration from the environment. A missing SESSION_SECRET is generated
 * once and kept in data/session-secret, so sign-ins survive a restart.
 */
export function loadConfig(env: NodeJS.ProcessEnv = process.env, secretFile = path.join(dataDir, 'session-secret')): Config {
  const parsed = envSchema.safeParse(Object.fromEntries(Object.entries(env).filter(([, v]) => v !== '')));
  if (!parsed.success) {
    throw new ConfigError(parsed.error.issues.map((i) => `${i.path.join('.') || 'environment'}: ${i.message}`));
  }
  const e = parsed.data;
  const { tls, issues } = readTlsFiles(e.TLS_CERT_FILE, e.TLS_KEY_FILE);
  if (issues.length) throw new ConfigError(issues);
  return {
    nodeEnv: e.NODE_ENV,
    port: e.PORT,
    host: e.HOST,
    databaseUrl: e.DATABASE_URL,
    smtpUrl: e.SMTP_URL,
    mockWsPort: e.MOCK_WS_PORT,
    sessionSecret: e.SESSION_SECRET ?? readOrCreateSecret(secretFile),
    uploadLimitBytes: e.UPLOAD_LIMIT_BYTES,
    uploadDir: path.resolve(e.UPLOAD_DIR),
    demoPassword: e.DEMO_PASSWORD ?? 'anglebench',
    tls,
    trustProxy: e.TRUST_PROXY,
    publicUrl: e.PUBLIC_URL,
    simBoardsMax: e.SIM_BOARDS_MAX,
    bridgeOrigins: e.BRIDGE_ORIGINS,
  };
}

function readOrCreateSecret(file: string): string {
  try {
    const existing = fs.readFileSync(file, 'utf8').trim();
    if (existing.length >= 16) return existing;
  } catch {
    // Not there yet: made below.
  }
  const secret = randomBytes(32).toString('hex');
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}
