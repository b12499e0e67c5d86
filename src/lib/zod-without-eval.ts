// zod would probe `new Function` to compile fast object parsers; the Content-Security-Policy
// (server/csp.ts) forbids eval, so the probe only raises a violation report. zod reads its
// configuration from this global (zod/v4/core `globalConfig`), so setting it here keeps zod
// itself out of the first download.
const g = globalThis as { __zod_globalConfig?: { jitless?: boolean } };
g.__zod_globalConfig = { ...g.__zod_globalConfig, jitless: true };

export {};
