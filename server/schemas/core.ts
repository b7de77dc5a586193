// The shapes of a core's JSON columns, checked on every write.

// The reference model's configuration is the numeric core's own schema (the keys the model, the
// runner and the simulated board share); parsing fills the defaults — the `reference-16` core.
// Imported from its module rather than the package index so the server depends only on
// committed numeric code.
export { modelConfigSchema, type ModelConfig as CoreModelConfig } from '../../shared/numeric/model-config';

/** How the bench talks to the core: the UART rate and the frame check (the API contract's). */
export { linkProfileSchema, type LinkProfile } from '../../shared/contract/cores';

export { limitsSchema } from '../../shared/link-engine/limits';
