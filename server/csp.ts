import { contentSecurityPolicy } from 'helmet';

/**
 * Content-Security-Policy of every response. The Vite build loads only same-origin module
 * scripts, its CSS, the self-hosted Barlow fonts (@fontsource, woff2 files in assets/) and
 * same-origin workers; three.js draws on a canvas (WebGL needs no directive) and may make
 * blob:/data: textures; React and the canvas overlays set inline style attributes.
 */
export const CSP_DIRECTIVES = {
  'default-src': ["'self'"],
  'script-src': ["'self'"],
  'style-src': ["'self'", "'unsafe-inline'"],
  'img-src': ["'self'", 'data:', 'blob:'],
  'font-src': ["'self'", 'data:'],
  'connect-src': ["'self'"],
  'worker-src': ["'self'", 'blob:'],
  'frame-src': ["'self'"],
  'object-src': ["'none'"],
  'base-uri': ["'self'"],
  'form-action': ["'self'"],
  'frame-ancestors': ["'none'"],
} as const;

export const cspMiddleware = contentSecurityPolicy({
  useDefaults: false,
  directives: Object.fromEntries(Object.entries(CSP_DIRECTIVES).map(([k, v]) => [k, [...v]])),
});
