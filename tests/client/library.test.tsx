import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { blankPackage, type NozzleDto, type PackageDto } from '../../shared/schemas/library.schema';
import { libraryRoute } from '../../src/app/routes/library/routes';
import { PackageForm } from '../../src/features/library/components/package-form';
import { ApiError } from '../../src/lib/api-client';
import { mockFetch, renderRoutes } from '../helpers/render';

const ID = '0b5d3c1e-8f3a-4f0e-9a51-2f8f4c0b1a11';
const meta = { version: 1, updatedAt: '2026-12-01T00:00:00.000Z', updatedBy: 'lena@harrowcreek.example' };
const nozzles: NozzleDto[] = [
  { id: '1b5d3c1e-8f3a-4f0e-9a51-2f8f4c0b1a11', name: 'N05', tipOuter: 0.5, tipInner: 0.25, holderRadius: 2, notes: '', ...meta },
  { id: '2b5d3c1e-8f3a-4f0e-9a51-2f8f4c0b1a11', name: 'N14', tipOuter: 1.4, tipInner: 0.9, holderRadius: 3.5, notes: '', ...meta },
];

function form(props: Partial<Parameters<typeof PackageForm>[0]> = {}) {
  const onSubmit = vi.fn(async () => undefined);
  render(<PackageForm label="New package" initial={{ ...blankPackage('C0402-T'), bodyLength: 1, bodyWidth: 0.5, tapePitch: 2 }} nozzles={nozzles} presets={[]} withAliases submitLabel="Add package" onSubmit={onSubmit} {...props} />);
  return { onSubmit, f: screen.getByRole('form', { name: 'New package' }) };
}

describe('package form', () => {
  it('explains a pocket pitch that does not suit the tape width, beside the field (EIA-481, from memory)', async () => {
    const { f, onSubmit } = form();
    await userEvent.selectOptions(within(f).getByLabelText('Tape width (mm)'), '12');
    await userEvent.click(within(f).getByRole('button', { name: 'Add package' }));
    expect(await within(f).findByText(/2 mm pocket pitch exists only on 8 mm tape/)).toBeTruthy();
    expect(within(f).getByLabelText('Pocket pitch').getAttribute('aria-invalid')).toBe('true');
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('refuses a size of zero and says so', async () => {
    const { f, onSubmit } = form();
    const len = within(f).getByLabelText('Length', { exact: true } as never);
    await userEvent.clear(len);
    await userEvent.type(len, '0');
    await userEvent.click(within(f).getByRole('button', { name: 'Add package' }));
    expect(await within(f).findByText('The body length must be more than 0 mm')).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('warns, without blocking, when a nozzle tip is wider than the body’s smaller side (common practice)', async () => {
    const { f, onSubmit } = form();
    await userEvent.selectOptions(within(f).getByLabelText('Add a nozzle'), 'N14');
    await userEvent.click(within(f).getByRole('button', { name: 'Add' }));
    const warnings = await screen.findByRole('list', { name: 'Warnings' });
    expect(warnings.textContent).toMatch(/N14's tip \(1\.400 mm\) is wider than the body's smaller side \(0\.500 mm\)/);
    await userEvent.type(within(f).getByLabelText('Aliases'), 'CAP-0402-T*, C_0402_T');
    await userEvent.click(within(f).getByRole('button', { name: 'Add package' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]).toEqual([expect.objectContaining({ name: 'C0402-T', bodyLength: 1, bodyWidth: 0.5, nozzles: ['N14'], tapeWidth: 8, tapePitch: 2, aliases: ['CAP-0402-T*', 'C_0402_T'] })]);
  });

  it('on a 409 keeps what the user typed and offers to load the other version', async () => {
    const onReload = vi.fn();
    const onSubmit = vi.fn(async () => {
      throw new ApiError({ status: 409, title: 'Conflict', detail: 'Package C0402-T was changed by someone else since you opened it (your version 1, now 2). Nothing was saved and nothing of theirs was lost: reload to see their change, then make yours again — your edits stay in the form.', errors: [] });
    });
    const { f } = form({ onSubmit, onReload });
    const h = within(f).getByLabelText('Height', { exact: true } as never);
    await userEvent.clear(h);
    await userEvent.type(h, '0.55');
    await userEvent.click(within(f).getByRole('button', { name: 'Add package' }));
    expect(await within(f).findByText(/changed by someone else/)).toBeTruthy();
    expect((h as HTMLInputElement).value).toBe('0.55');
    await userEvent.click(within(f).getByRole('button', { name: /Load their version/ }));
    expect(onReload).toHaveBeenCalled();
  });

  it('draws the package (a canvas in the figure)', () => {
    form();
    const fig = screen.getByRole('figure', { name: 'Package drawing' });
    expect(fig.querySelector('canvas')).toBeTruthy();
    expect(fig.textContent).toMatch(/courtyard 0\.250 mm/);
  });
});

describe('library pages', () => {
  const pkg: PackageDto = { ...blankPackage('R0603'), id: ID, ...meta, aliases: [{ id: ID, pattern: 'RES-0603*', version: 1 }], warnings: [] };
  const answers = (roles: string[]) => (url: string) => {
    if (url === '/api/me') return { status: 200, body: { user: { id: ID, email: 'x@harrowcreek.example', name: 'X', roles, active: true, lastSignInAt: null, createdAt: meta.updatedAt, version: 1 } } };
    if (url === '/api/library/packages') return { status: 200, body: { items: [pkg] } };
    if (url === '/api/library/proposals' || url === '/api/library/unmatched') return { status: 200, body: { items: [] } };
    return undefined;
  };

  it('a librarian sees the packages table with a New package action', async () => {
    mockFetch(answers(['librarian']));
    renderRoutes([libraryRoute], '/library/packages');
    const table = await screen.findByRole('table', { name: 'Packages' });
    expect(within(table).getByText('R0603')).toBeTruthy();
    expect(within(table).getByText('1.600 × 0.800 × 0.500')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'New package' })).toBeTruthy();
  });

  it('an engineer is offered to propose instead', async () => {
    mockFetch(answers(['engineer']));
    renderRoutes([libraryRoute], '/library/packages');
    expect(await screen.findByRole('button', { name: 'Propose a package' })).toBeTruthy();
  });

  it('the unmatched queue says what to do when it is empty', async () => {
    mockFetch(answers(['librarian']));
    renderRoutes([libraryRoute], '/library/unmatched');
    expect(await screen.findByText('Every imported footprint matches a package')).toBeTruthy();
  });
});
