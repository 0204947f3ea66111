// First use: a browser that was not signed in gets the sign-in form at once,
// not a bare loading bar while /api/me answers; a browser that was signed in waits for it.
import { render, screen } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it } from 'vitest';
import { AppProvider } from '../../src/app/provider';
import { routes } from '../../src/app/router';
import { appQueryClient } from '../../src/lib/query-client';
import { hasSessionHint, setSessionHint } from '../../src/lib/session-hint';

/** /api/me never answers (a slow first request); anything else is a test error. */
function slowMe() {
  globalThis.fetch = ((input: RequestInfo | URL) => {
    const url = typeof input === 'string' ? input : input.toString();
    if (url === '/api/me') return new Promise<Response>(() => {});
    throw new Error(`unexpected fetch ${url}`);
  }) as typeof fetch;
}

function renderApp(path: string) {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  return render(
    <AppProvider client={appQueryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
}

afterEach(() => {
  appQueryClient.clear();
  setSessionHint(false);
});

describe('first use', () => {
  it('not signed in before: the sign-in form shows while /api/me is still on its way', async () => {
    setSessionHint(false);
    slowMe();
    renderApp('/programs');
    expect(await screen.findByRole('heading', { name: 'Sign in' }, { timeout: 1000 })).toBeTruthy();
    expect(screen.getByLabelText('E-mail')).toBeTruthy();
  });

  it('signed in before: a loading bar until the server says who it is', async () => {
    setSessionHint(true);
    expect(hasSessionHint()).toBe(true);
    slowMe();
    renderApp('/programs');
    expect(await screen.findByRole('progressbar', { name: 'Loading' })).toBeTruthy();
    expect(screen.queryByRole('heading', { name: 'Sign in' })).toBeNull();
  });
});
