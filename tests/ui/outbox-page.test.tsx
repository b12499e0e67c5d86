// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { OutboxPage } from '@/features/outbox/components/outbox-page';
import { mockApi, renderAt } from './admin-helpers';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('outbox page', () => {
  it('lists to, subject and time; opening a mail shows its text', async () => {
    mockApi('admin', {
      'GET /api/admin/outbox': () => ({
        body: {
          items: [
            {
              id: 2,
              to: 'ilse@t.test',
              from: 'no-reply@t.test',
              subject: 'You are invited',
              text: 'Hello Ilse,\nopen http://x.test/accept-invite?token=SECRET123 once',
              createdAt: '2026-01-04T10:00:00.000Z',
            },
          ],
        },
      }),
    });
    const user = userEvent.setup();
    renderAt(<OutboxPage />, '/outbox');
    const item = (await screen.findByText('You are invited')).closest('li')!;
    expect(within(item).getByText('ilse@t.test')).toBeTruthy();
    expect(within(item).queryByText(/Hello Ilse/)).toBeNull();
    await user.click(within(item).getByRole('button', { expanded: false }));
    expect(within(item).getByText(/Hello Ilse/).textContent).toContain(
      'accept-invite?token=[hidden] once',
    );
    expect(item.textContent).not.toContain('SECRET123');
  });

  it('says there is no outbox when mail goes to an SMTP server', async () => {
    mockApi('admin', {
      'GET /api/admin/outbox': () => ({
        status: 404,
        body: { error: { code: 'not_found', message: 'no outbox' } },
      }),
    });
    renderAt(<OutboxPage />, '/outbox');
    expect(await screen.findByText(/there is no outbox to show/)).toBeTruthy();
  });
});
