// What a benchmark and the app server it runs in a child process (server-process.ts) say to each
// other over IPC.
import { modelConfigSchema } from '../server/schemas/core';
import type { BenchDialect } from './bare-driver';

/** 2^22 codes: a 22-bit binary-angle core's exhaustive run, the largest size `scale` measures. */
export const SCALE_CORE_CONFIG = modelConfigSchema.parse({ angleBits: 22 });

export type ServerRequest = { kind: 'mark' } | { kind: 'peak' } | { kind: 'bare'; bytes: number } | { kind: 'stop' };
export type ServerReply =
  /** `coreSlug`: the 22-bit core; `bigCoreSlug`: the 20-bit core of server-fixture.ts. */
  | { kind: 'ready'; url: string; token: string; coreSlug: string; bigCoreSlug: string; dialect: BenchDialect }
  | { kind: 'mark'; rss: number; peak: number }
  | { kind: 'peak'; peak: number }
  | { kind: 'bare'; growth: number };
