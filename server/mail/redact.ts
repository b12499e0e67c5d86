/**
 * One-use links (password reset, invitation) must reach nobody but their addressee: whatever
 * shows mail to anyone else (the development outbox) shows it through this. Share-link tokens
 * are removed too.
 */
const PATTERNS: readonly [RegExp, string][] = [
  [/([?&]token=)[^\s&#"'<>]+/gi, '$1[redacted]'],
  // better-auth's own link form, /api/auth/reset-password/<token>
  [/(\/reset-password\/)[^\s?#"'<>/]+/gi, '$1[redacted]'],
  [/(\/share\/)[^\s?#"'<>/]+/gi, '$1[redacted]'],
];

export const REDACTED = '[redacted]';

export function redactOneUseLinks(text: string): string {
  let out = text;
  for (const [re, to] of PATTERNS) out = out.replace(re, to);
  return out;
}
