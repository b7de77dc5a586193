// Soak runs and operating conditions: pure, shared by the runner, the Bench page and the server.
export * from './conditions';
export * from './soak-spec';
export * from './soak-accumulator';
export * from './soak-record';
export * from './board-conditions';
export * from './soak-run';
export * from './vector-soak';
