// Checking a reply against its contract schema, on the server before it is sent and in the
// client (in development) when it arrives: a mismatch names the field at fault.
import type { z } from 'zod';

export class ContractError extends Error {
  constructor(
    message: string,
    readonly issues: Array<{ path: string; message: string }>,
  ) {
    super(message);
    this.name = 'ContractError';
  }
}

/** Throw a ContractError when `value` does not match `schema`; `what` says which reply it is. */
export function checkContract(schema: z.ZodType, value: unknown, what: string): void {
  const result = schema.safeParse(value);
  if (result.success) return;
  const issues = result.error.issues.map((i) => ({ path: i.path.map(String).join('.') || '(the reply)', message: i.message }));
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : '';
  throw new ContractError(`${what} does not match its contract: ${issues[0].path}: ${issues[0].message}${more}`, issues);
}

/** A reply as the server holds it before it becomes JSON: its dates may still be Date objects. */
export type Sendable<T> = T extends string
  ? T | Date
  : T extends readonly (infer U)[]
    ? Sendable<U>[]
    : T extends object
      ? { [K in keyof T]: Sendable<T[K]> }
      : T;
