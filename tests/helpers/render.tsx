import { QueryClient } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import type { ReactElement } from 'react';
import { createMemoryRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { AppProvider } from '../../src/app/provider';

/** Renders routes in a memory router with a fresh query client (no retries). */
export function renderRoutes(routes: RouteObject[], initialPath = '/') {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const router = createMemoryRouter(routes, { initialEntries: [initialPath] });
  const utils = render(
    <AppProvider client={client}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...utils, router, client };
}

export function renderWithProviders(ui: ReactElement) {
  return renderRoutes([{ path: '*', element: ui }]);
}

type Handler = (url: string, init?: RequestInit) => { status: number; body?: unknown } | undefined;

/** Replaces fetch with a table of answers; unknown calls fail the test loudly. */
export function mockFetch(handler: Handler) {
  const calls: { url: string; init?: RequestInit }[] = [];
  globalThis.fetch = (async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = typeof input === 'string' ? input : input.toString();
    calls.push({ url, init });
    const answer = handler(url, init);
    if (!answer) throw new Error(`unexpected fetch ${init?.method ?? 'GET'} ${url}`);
    return new Response(answer.body === undefined ? null : JSON.stringify(answer.body), {
      status: answer.status,
      headers: { 'Content-Type': answer.status >= 400 ? 'application/problem+json' : 'application/json' },
    });
  }) as typeof fetch;
  return calls;
}
