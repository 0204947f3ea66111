import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { DataTable } from '../../src/components/ui/data-table';

interface Row { ref: string; x: number }
const data: Row[] = [
  { ref: 'R10', x: 3 },
  { ref: 'C2', x: 1 },
  { ref: 'U1', x: 2 },
];
const columns = [
  { accessorKey: 'ref', header: 'Ref' },
  { accessorKey: 'x', header: 'X' },
];

function refs() {
  return within(screen.getByRole('table', { name: 'Parts' }))
    .getAllByRole('row')
    .slice(1)
    .map((r) => r.querySelector('td')?.textContent);
}

describe('DataTable', () => {
  it('sorts by a column on click and reverses on a second click', async () => {
    render(<DataTable<Row> label="Parts" data={data} columns={columns} getRowId={(r) => r.ref} />);
    await userEvent.click(screen.getByRole('button', { name: /X/ }));
    expect(refs()).toEqual(['C2', 'U1', 'R10']);
    await userEvent.click(screen.getByRole('button', { name: /X/ }));
    expect(refs()).toEqual(['R10', 'U1', 'C2']);
  });

  it('filters rows and says how many match', async () => {
    render(<DataTable<Row> label="Parts" data={data} columns={columns} getRowId={(r) => r.ref} />);
    await userEvent.type(screen.getByRole('searchbox', { name: 'Filter Parts' }), 'u1');
    expect(refs()).toEqual(['U1']);
    expect(screen.getByText('1 of 3 rows')).toBeTruthy();
  });

  it('shows the empty state it is given', () => {
    render(<DataTable<Row> label="Parts" data={[]} columns={columns} empty="Import a centroid file to see parts." />);
    expect(screen.getByText('Import a centroid file to see parts.')).toBeTruthy();
  });
});

describe('DataTable with thousands of rows', () => {
  it('keeps only a window of rows in the DOM', () => {
    const many = Array.from({ length: 5000 }, (_, i) => ({ ref: `R${i + 1}`, x: i }));
    render(<DataTable<Row> label="Parts" data={many} columns={columns} getRowId={(r) => r.ref} height={400} />);
    const rendered = within(screen.getByRole('table', { name: 'Parts' })).queryAllByRole('row').length;
    expect(rendered).toBeLessThan(200);
    expect(screen.getByText('5000 rows')).toBeTruthy();
  });
});
