// What GET /api/compare answers: the contract's types (shared/contract/compare.ts).
export type { CompareReply, CompareStats, ComparedPair, ComparedSession, DifferingCode } from '../../../../shared/contract/compare';
export type { LimitOutcome } from '../../../../shared/contract/sessions';
