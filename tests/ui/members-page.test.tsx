// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MembersPage } from '@/features/team/components/members-page';
import { AcceptInvitePage } from '@/features/team/components/accept-invite-page';
import { mockApi, renderAt } from './admin-helpers';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const members = [
  {
    userId: 'u-admin',
    email: 'admin@t.test',
    name: 'Ada Admin',
    role: 'admin',
    createdAt: '2026-01-02T10:00:00.000Z',
  },
  {
    userId: 'u-des',
    email: 'des@t.test',
    name: 'Dev Designer',
    role: 'designer',
    createdAt: '2026-01-03T10:00:00.000Z',
  },
];
const LAST_ADMIN =
  'A team keeps at least one admin: this is the only admin, so they cannot be removed or given another role. Make another member admin first.';

describe('members page', () => {
  it('names each bad field of the invitation before sending, then sends it', async () => {
    const calls = mockApi('admin', {
      'GET /api/team/members': () => ({ body: { items: members } }),
      'GET /api/team/invitations': () => ({ body: { items: [] } }),
      'POST /api/team/invitations': (c) => {
        const b = JSON.parse(c.body!) as { email: string; name: string; role: string };
        return {
          status: 201,
          body: {
            id: 'i1',
            ...b,
            state: 'pending',
            createdAt: '2026-01-04T10:00:00.000Z',
            expiresAt: '2026-01-11T10:00:00.000Z',
            acceptedAt: null,
            revokedAt: null,
            invitedBy: 'Ada Admin',
          },
        };
      },
    });
    const user = userEvent.setup();
    renderAt(<MembersPage />, '/team');
    await screen.findByText('Dev Designer');
    const form = screen.getByRole('form', { name: 'Invite a member' });
    await user.click(within(form).getByRole('button', { name: 'Send invitation' }));
    expect(await within(form).findByText('Name must not be empty')).toBeTruthy();
    expect(within(form).getByText('E-mail must be an e-mail address')).toBeTruthy();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await user.type(within(form).getByLabelText('Name'), 'Ilse Varga');
    await user.type(within(form).getByLabelText('E-mail'), 'ilse@t.test');
    await user.selectOptions(within(form).getByLabelText('Role'), 'checker');
    await user.click(within(form).getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText(/Invitation sent to ilse@t.test/)).toBeTruthy();
    const post = calls.find((c) => c.method === 'POST' && c.path === '/api/team/invitations')!;
    expect(JSON.parse(post.body!)).toEqual({
      name: 'Ilse Varga',
      email: 'ilse@t.test',
      role: 'checker',
    });
  });

  it('puts a server refusal on the field it names', async () => {
    mockApi('admin', {
      'GET /api/team/members': () => ({ body: { items: members } }),
      'GET /api/team/invitations': () => ({ body: { items: [] } }),
      'POST /api/team/invitations': () => ({
        status: 409,
        body: {
          error: {
            code: 'conflict',
            message: 'des@t.test already has an account',
            details: [{ path: 'email', message: 'already has an account' }],
          },
        },
      }),
    });
    const user = userEvent.setup();
    renderAt(<MembersPage />, '/team');
    const form = await screen.findByRole('form', { name: 'Invite a member' });
    await user.type(within(form).getByLabelText('Name'), 'Dev');
    await user.type(within(form).getByLabelText('E-mail'), 'des@t.test');
    await user.click(within(form).getByRole('button', { name: 'Send invitation' }));
    expect(await within(form).findByText('E-mail already has an account')).toBeTruthy();
  });

  it('shows why the last admin cannot be demoted or removed', async () => {
    const calls = mockApi('admin', {
      'GET /api/team/members': () => ({ body: { items: members } }),
      'GET /api/team/invitations': () => ({ body: { items: [] } }),
      'PATCH /api/team/members/u-admin': () => ({
        status: 409,
        body: {
          error: {
            code: 'conflict',
            message: LAST_ADMIN,
            details: [{ path: 'role', message: 'the last admin keeps the admin role' }],
          },
        },
      }),
      'DELETE /api/team/members/u-admin': () => ({
        status: 409,
        body: { error: { code: 'conflict', message: LAST_ADMIN } },
      }),
    });
    const user = userEvent.setup();
    renderAt(<MembersPage />, '/team');
    const row = (await screen.findByText('admin@t.test')).closest('tr')!;
    expect(within(row).getByText("The team's only admin")).toBeTruthy();
    await user.selectOptions(within(row).getByLabelText('Role of Ada Admin'), 'lead');
    expect((await within(row).findByRole('alert')).textContent).toContain(
      'A team keeps at least one admin',
    );
    expect(calls.find((c) => c.method === 'PATCH')!.body).toBe(JSON.stringify({ role: 'lead' }));
    await user.click(within(row).getByRole('button', { name: 'Remove Ada Admin' }));
    await user.click(within(row).getByRole('button', { name: 'Confirm removal' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'DELETE')).toBe(true));
    expect((await within(row).findByRole('alert')).textContent).toContain('only admin');
  });

  it('lists invitations with their state; a pending one can be withdrawn', async () => {
    const inv = {
      id: 'i9',
      email: 'oskar@t.test',
      name: 'Oskar Lind',
      role: 'designer',
      createdAt: '2026-01-04T10:00:00.000Z',
      expiresAt: '2026-01-11T10:00:00.000Z',
      acceptedAt: null,
      revokedAt: null,
      invitedBy: 'Ada Admin',
    };
    const calls = mockApi('admin', {
      'GET /api/team/members': () => ({ body: { items: members } }),
      'GET /api/team/invitations': () => ({ body: { items: [{ ...inv, state: 'pending' }] } }),
      'DELETE /api/team/invitations/i9': () => ({
        body: { ...inv, state: 'revoked', revokedAt: '2026-01-05T10:00:00.000Z' },
      }),
    });
    const user = userEvent.setup();
    renderAt(<MembersPage />, '/team');
    const row = (await screen.findByText('oskar@t.test')).closest('tr')!;
    expect(within(row).getByText('Waiting')).toBeTruthy();
    await user.click(within(row).getByRole('button', { name: 'Withdraw' }));
    await waitFor(() =>
      expect(
        calls.some((c) => c.method === 'DELETE' && c.path === '/api/team/invitations/i9'),
      ).toBe(true),
    );
  });

  it('is read-only for a member who cannot manage the team', async () => {
    mockApi('designer', { 'GET /api/team/members': () => ({ body: { items: members } }) });
    renderAt(<MembersPage />, '/team');
    await screen.findByText('Dev Designer');
    expect(screen.queryByRole('form', { name: 'Invite a member' })).toBeNull();
    expect(screen.queryByRole('button', { name: /Remove/ })).toBeNull();
  });
});

describe('accept-invite page', () => {
  it('shows the invitation, checks the repeated password, accepts and signs in', async () => {
    const calls = mockApi('checker', {
      'POST /api/invitations/lookup': () => ({
        body: {
          email: 'ilse@t.test',
          name: 'Ilse Varga',
          role: 'checker',
          team: { name: 'Test Team' },
          expiresAt: '2026-01-11T10:00:00.000Z',
        },
      }),
      'POST /api/invitations/accept': () => ({
        status: 201,
        body: { email: 'ilse@t.test', name: 'Ilse Varga', role: 'checker' },
      }),
      'POST /api/auth/sign-in/email': () => ({ body: { ok: true } }),
    });
    const user = userEvent.setup();
    renderAt(<AcceptInvitePage />, '/accept-invite?token=tok-0123456789abcdef');
    expect((await screen.findByTestId('invited-role')).textContent).toBe('Checker');
    await user.type(screen.getByLabelText('New password'), 'short');
    await user.type(screen.getByLabelText('Repeat the password'), 'other');
    await user.click(screen.getByRole('button', { name: 'Join the team and sign in' }));
    expect(await screen.findByText('New password must be at least 10 characters')).toBeTruthy();
    await user.clear(screen.getByLabelText('New password'));
    await user.type(screen.getByLabelText('New password'), 'a-good-password');
    await user.click(screen.getByRole('button', { name: 'Join the team and sign in' }));
    expect(await screen.findByText('Repeated password does not match the password')).toBeTruthy();
    await user.clear(screen.getByLabelText('Repeat the password'));
    await user.type(screen.getByLabelText('Repeat the password'), 'a-good-password');
    await user.click(screen.getByRole('button', { name: 'Join the team and sign in' }));
    expect(await screen.findByText('elsewhere')).toBeTruthy();
    const accept = calls.find((c) => c.path === '/api/invitations/accept')!;
    expect(JSON.parse(accept.body!)).toEqual({
      token: 'tok-0123456789abcdef',
      password: 'a-good-password',
    });
    const signIn = calls.find((c) => c.path === '/api/auth/sign-in/email')!;
    expect(JSON.parse(signIn.body!)).toEqual({ email: 'ilse@t.test', password: 'a-good-password' });
  });

  it('says why a used link cannot be used', async () => {
    mockApi('checker', {
      'POST /api/invitations/lookup': () => ({
        status: 410,
        body: {
          error: {
            code: 'gone',
            message: 'This invitation has already been used.',
            details: { state: 'accepted' },
          },
        },
      }),
    });
    renderAt(<AcceptInvitePage />, '/accept-invite?token=tok-0123456789abcdef');
    expect(await screen.findByText('This invitation has already been used.')).toBeTruthy();
    expect(screen.queryByLabelText('New password')).toBeNull();
  });
});
