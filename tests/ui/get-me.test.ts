import { describe, expect, it } from 'vitest';
import { meSchema } from '@/features/auth/api/get-me';

describe('the /api/me answer check (hand-written, part of the shell)', () => {
  const good = {
    user: { id: 'u1', email: 'a@b.test', name: 'A' },
    team: { id: 't1', name: 'T' },
    role: 'designer',
    permissions: ['spool:view'],
  };

  it('accepts the answer the server gives and fills defaults', () => {
    expect(meSchema.safeParse(good)).toEqual({ success: true, data: good });
    const noTeam = meSchema.safeParse({
      user: { id: 'u1', email: 'a@b.test' },
      team: null,
      role: null,
    });
    expect(noTeam).toEqual({
      success: true,
      data: {
        user: { id: 'u1', email: 'a@b.test', name: null },
        team: null,
        role: null,
        permissions: [],
      },
    });
  });

  it.each([
    ['user', { ...good, user: { id: 1, email: 'a@b.test' } }],
    ['user.name', { ...good, user: { id: 'u1', email: 'a@b.test', name: 3 } }],
    ['team', { ...good, team: { id: 't1' } }],
    ['role', { ...good, role: 7 }],
    ['permissions', { ...good, permissions: [1] }],
  ])('refuses a bad %s and names it', (path, body) => {
    const r = meSchema.safeParse(body);
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues[0]?.path.join('.')).toBe(path);
  });
});
