import type { ReactNode } from 'react';
import { render } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import { vi } from 'vitest';
import { createQueryClient } from '@/lib/query-client';

export interface SeenCall {
  method: string;
  path: string;
  search: URLSearchParams;
  body: string | undefined;
  contentType: string | null;
}

type Handler = (call: SeenCall) => { status?: number; body?: unknown } | undefined;

/** Stub fetch with `METHOD /path` handlers; /api/me answers as `role`. Returns the calls seen. */
export function mockApi(role: string, handlers: Record<string, Handler>): SeenCall[] {
  const calls: SeenCall[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string, init?: RequestInit) => {
      const url = new URL(input, 'http://test.local');
      const headers = new Headers(init?.headers);
      const call: SeenCall = {
        method: init?.method ?? 'GET',
        path: url.pathname,
        search: url.searchParams,
        body: typeof init?.body === 'string' ? init.body : undefined,
        contentType: headers.get('content-type'),
      };
      calls.push(call);
      if (url.pathname === '/api/me') {
        return new Response(
          JSON.stringify({
            user: { id: 'u-admin', email: 'admin@t.test', name: 'Ada Admin' },
            team: { id: 't', name: 'Test Team' },
            role,
            permissions: [],
          }),
          { status: 200 },
        );
      }
      const h = handlers[`${call.method} ${url.pathname}`];
      const out = h?.(call);
      if (!out)
        return new Response(
          JSON.stringify({
            error: { code: 'not_found', message: `no route ${call.method} ${url.pathname}` },
          }),
          { status: 404 },
        );
      return new Response(out.body === undefined ? '' : JSON.stringify(out.body), {
        status: out.status ?? 200,
      });
    }),
  );
  return calls;
}

export function renderAt(ui: ReactNode, path: string, routePath = path.split('?')[0]!) {
  return render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route path={routePath} element={ui} />
          <Route path="*" element={<p>elsewhere</p>} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

export const csvFile = (text: string, name = 'upload.csv') =>
  new File([text], name, { type: 'text/csv' });
