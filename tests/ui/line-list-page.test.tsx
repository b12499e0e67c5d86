// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { LineListPage } from '@/features/line-list/components/line-list-page';
import { ForgotPasswordPage } from '@/features/auth/components/forgot-password-page';
import { ResetPasswordPage } from '@/features/auth/components/reset-password-page';
import { csvFile, mockApi, renderAt } from './admin-helpers';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const goodRow = {
  line: 2,
  name: 'LL-1',
  pipeLine: '2"-P-1',
  units: 'imperial',
  conditions: { pressure: 150, temperature: 100, material: 'A106-B', corrosionAllowance: 0.0625 },
};

describe('line-list import page', () => {
  it('previews the spools and every bad cell by line and column; creates none while any is bad', async () => {
    const calls = mockApi('designer', {
      'POST /api/spools/import/preview': () => ({
        body: {
          ok: false,
          items: [goodRow],
          issues: [
            {
              line: 3,
              column: 'pressure',
              path: 'line 3: pressure',
              message: 'Invalid input: expected number, received string',
            },
            { line: 4, column: 'name', path: 'line 4: name', message: 'is required' },
          ],
        },
      }),
    });
    const user = userEvent.setup();
    renderAt(<LineListPage />, '/line-list');
    await user.upload(
      screen.getByLabelText('Line-list CSV'),
      csvFile('name,pressure,temperature\nLL-1,150,100\nLL-2,abc,100\n,150,100\n', 'lines.csv'),
    );
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    const issues = await screen.findByTestId('csv-issues');
    const rows = within(issues).getAllByRole('row').slice(1);
    expect(rows.map((r) => [r.getAttribute('data-line'), r.getAttribute('data-column')])).toEqual([
      ['3', 'pressure'],
      ['4', 'name'],
    ]);
    const preview = screen.getByTestId('line-list-preview');
    expect(within(preview).getByText('LL-1')).toBeTruthy();
    expect(within(preview).getByText('150 psi')).toBeTruthy();
    expect(screen.getByText(/so none will be created/)).toBeTruthy();
    expect(screen.queryByRole('button', { name: /^Create/ })).toBeNull();
    expect(calls.find((c) => c.path === '/api/spools/import/preview')!.contentType).toBe(
      'text/csv',
    );
  });

  it('creates all the spools after a clean check and links to them', async () => {
    const calls = mockApi('designer', {
      'POST /api/spools/import/preview': () => ({
        body: { ok: true, issues: [], items: [goodRow, { ...goodRow, line: 3, name: 'LL-2' }] },
      }),
      'POST /api/spools/import': () => ({
        status: 201,
        body: {
          created: 2,
          items: [
            { id: 's1', name: 'LL-1' },
            { id: 's2', name: 'LL-2' },
          ],
        },
      }),
    });
    const user = userEvent.setup();
    renderAt(<LineListPage />, '/line-list');
    await user.upload(
      screen.getByLabelText('Line-list CSV'),
      csvFile('name,pressure,temperature\nLL-1,150,100\nLL-2,150,100\n'),
    );
    await user.click(screen.getByRole('button', { name: 'Check the file' }));
    await user.click(await screen.findByRole('button', { name: 'Create 2 spools' }));
    const done = await screen.findByText(/Created 2 spools/);
    expect(within(done).getByRole('link', { name: 'LL-2' }).getAttribute('href')).toBe(
      '/spools/s2',
    );
    expect(calls.filter((c) => c.path === '/api/spools/import').length).toBe(1);
  });
});

describe('password reset pages', () => {
  it('forgot password validates the address and asks for the mail with the reset page as target', async () => {
    const calls = mockApi('designer', {
      'POST /api/auth/request-password-reset': () => ({ body: { status: true } }),
    });
    const user = userEvent.setup();
    renderAt(<ForgotPasswordPage />, '/forgot-password');
    await user.type(screen.getByLabelText('Email'), 'nope');
    await user.click(screen.getByRole('button', { name: 'Send the reset link' }));
    expect(await screen.findByText('E-mail must be a valid address')).toBeTruthy();
    await user.clear(screen.getByLabelText('Email'));
    await user.type(screen.getByLabelText('Email'), 'fab@t.test');
    await user.click(screen.getByRole('button', { name: 'Send the reset link' }));
    expect(await screen.findByText(/a link is on its way/)).toBeTruthy();
    const body = JSON.parse(
      calls.find((c) => c.path === '/api/auth/request-password-reset')!.body!,
    );
    expect(body).toEqual({
      email: 'fab@t.test',
      redirectTo: `${window.location.origin}/reset-password`,
    });
  });

  it('reset page sends the token with the new password and says when the link is spent', async () => {
    let spent = false;
    const calls = mockApi('designer', {
      'POST /api/auth/reset-password': () =>
        spent
          ? { status: 400, body: { code: 'INVALID_TOKEN', message: 'Invalid token' } }
          : { body: { status: true } },
    });
    const user = userEvent.setup();
    renderAt(<ResetPasswordPage />, '/reset-password?token=abc123');
    await user.type(screen.getByLabelText('New password'), 'a-new-password-1');
    await user.type(screen.getByLabelText('Repeat the password'), 'a-new-password-1');
    await user.click(screen.getByRole('button', { name: 'Set the new password' }));
    expect(await screen.findByText(/Your password has been changed/)).toBeTruthy();
    expect(JSON.parse(calls.find((c) => c.path === '/api/auth/reset-password')!.body!)).toEqual({
      token: 'abc123',
      newPassword: 'a-new-password-1',
    });

    cleanup();
    spent = true;
    renderAt(<ResetPasswordPage />, '/reset-password?token=abc123');
    await user.type(screen.getByLabelText('New password'), 'a-new-password-1');
    await user.type(screen.getByLabelText('Repeat the password'), 'a-new-password-1');
    await user.click(screen.getByRole('button', { name: 'Set the new password' }));
    expect(await screen.findByText(/This reset link is not valid any more/)).toBeTruthy();
  });
});
