import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { SignInRoute } from '../../src/app/routes/sign-in';
import { mockFetch, renderRoutes } from '../helpers/render';

const routes = [
  { path: '/sign-in', element: <SignInRoute /> },
  { path: '/', element: <p>home page</p> },
];

describe('sign-in page', () => {
  it('shows field errors beside the fields before sending anything', async () => {
    const calls = mockFetch((url) => (url === '/api/me' ? { status: 401, body: { status: 401, title: 'Not signed in', detail: 'Sign in', errors: [] } } : undefined));
    renderRoutes(routes, '/sign-in');
    await screen.findByRole('heading', { name: 'Sign in' });
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter an e-mail address')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
    expect(calls.filter((c) => c.url.includes('sign-in'))).toHaveLength(0);
  });

  it('shows the server’s message on a wrong password, then goes home on success', async () => {
    let attempt = 0;
    mockFetch((url, init) => {
      if (url === '/api/me') return { status: 401, body: { status: 401, title: 'Not signed in', detail: 'x', errors: [] } };
      if (url === '/api/auth/csrf') return { status: 200, body: { token: 'tok' } };
      if (url === '/api/auth/sign-in') {
        expect((init?.headers as Record<string, string>)['X-CSRF-Token']).toBe('tok');
        attempt += 1;
        if (attempt === 1) return { status: 401, body: { status: 401, title: 'Not signed in', detail: 'The e-mail or password is not right. Check both and try again.', errors: [] } };
        return {
          status: 200,
          body: { csrfToken: 't2', user: { id: '0b5d3c1e-8f3a-4f0e-9a51-2f8f4c0b1a11', email: 'ellis@harrowcreek.example', name: 'Ellis', roles: ['engineer'], active: true, lastSignInAt: null, createdAt: '2026-12-01T00:00:00.000Z', version: 1 } },
        };
      }
      return undefined;
    });
    renderRoutes(routes, '/sign-in');
    await userEvent.type(await screen.findByLabelText('E-mail'), 'ellis@harrowcreek.example');
    await userEvent.type(screen.getByLabelText('Password'), 'wrong');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText(/e-mail or password is not right/)).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(screen.getByText('home page')).toBeTruthy());
  });
});
