import { z } from 'zod';

// zod would probe `new Function` to compile fast object parsers; the Content-Security-Policy
// (server/csp.ts) forbids eval, so the probe only raises a violation report. Parse without it.
z.config({ jitless: true });
