// What the scale benchmark and its child server (scale-server.ts) say to each other over IPC.
import { modelConfigSchema } from '../server/schemas/core';

/** 2^22 codes: a 22-bit binary-angle core's exhaustive run, the largest size measured. */
export const SCALE_CORE_CONFIG = modelConfigSchema.parse({ angleBits: 22 });

export type ScaleRequest = { kind: 'mark' } | { kind: 'peak' } | { kind: 'bare'; bytes: number } | { kind: 'stop' };
export type ScaleReply =
  | { kind: 'ready'; url: string; token: string; coreSlug: string }
  | { kind: 'mark'; rss: number; peak: number }
  | { kind: 'peak'; peak: number }
  | { kind: 'bare'; growth: number };
