// Types of eslint.config.js for the tests that read its layer table (tests/lint/layers.test.ts).
export declare const ENGINE_LAYERS: Record<string, string[]>;
declare const config: unknown[];
export default config;
