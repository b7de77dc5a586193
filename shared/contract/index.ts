// The API contract: every request body and reply of /api, as zod schemas both sides share.
export * from './boards';
export * from './builds';
export * from './check';
export * from './common';
export * from './compare';
export * from './condition-grid';
export * from './cores';
export * from './misc';
export * from './people';
export * from './session-explanation';
export * from './sessions';
export * from './stations';
