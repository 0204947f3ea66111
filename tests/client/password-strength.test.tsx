import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import AccountRoute from '../../src/app/routes/account';
import { mockFetch, renderRoutes } from '../helpers/render';

const me = { user: { id: '0b5d3c1e-8f3a-4f0e-9a51-2f8f4c0b1a11', email: 'ellis@harrowcreek.example', name: 'Ellis Marsh', roles: ['engineer'], active: true, lastSignInAt: null, createdAt: '2026-12-01T00:00:00.000Z', version: 1 } };

describe('account: password strength as you type', () => {
  it('calls ten ones too easy to guess and says why; a passphrase is good', async () => {
    mockFetch((url) => (url === '/api/me' ? { status: 200, body: me } : undefined));
    renderRoutes([{ path: '/account', element: <AccountRoute /> }], '/account');
    const field = await screen.findByLabelText('New password');
    await userEvent.type(field, '1111111111');
    const note = await screen.findByRole('status', { name: 'Password strength' });
    expect(await screen.findByText(/very weak \(0 of 4\)/)).toBeTruthy();
    expect(note.textContent).toMatch(/Too easy to guess\. Repeated characters/);
    await userEvent.clear(field);
    await userEvent.type(field, 'tidal-lantern-quarry-58');
    expect(await screen.findByText(/very strong \(4 of 4\)\. Good\./)).toBeTruthy();
  });
});
