import type { ColumnDef } from '@tanstack/react-table';
import { useNavigate } from 'react-router-dom';
import type { PackageDto } from '../../../../shared/schemas/library.schema';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { Badge, EmptyState } from '../../../components/ui/misc';
import { usePackages } from '../../../features/library/api/packages';
import { useLibraryAccess } from '../../../features/library/hooks/use-library-access';
import { Loaded, mm3 } from './shared';

const columns: ColumnDef<PackageDto, any>[] = [
  { accessorKey: 'name', header: 'Name', cell: ({ row }) => <span className="font-medium">{row.original.name}</span> },
  { accessorKey: 'family', header: 'Family' },
  {
    id: 'size',
    header: 'L × W × H (mm)',
    accessorFn: (p) => p.bodyLength * p.bodyWidth,
    cell: ({ row: { original: p } }) => <span className="num text-xs">{mm3(p.bodyLength)} × {mm3(p.bodyWidth)} × {mm3(p.bodyHeight)}</span>,
  },
  { accessorKey: 'rotationOffset', header: 'Rotation offset', cell: ({ getValue }) => <span className="num text-xs">{(getValue() as number).toFixed(1)}°</span> },
  { accessorKey: 'courtyard', header: 'Courtyard', cell: ({ getValue }) => <span className="num text-xs">{mm3(getValue() as number)} mm</span> },
  { id: 'nozzles', header: 'Nozzles', accessorFn: (p) => p.nozzles.join(' '), cell: ({ getValue }) => <span className="num text-xs">{(getValue() as string) || '(largest that fits)'}</span> },
  { id: 'vision', header: 'Vision preset', accessorFn: (p) => p.vision ?? '' },
  { id: 'tape', header: 'Tape', accessorFn: (p) => (p.tapeWidth ? `${p.tapeWidth}/${p.tapePitch}` : p.feeder), cell: ({ row: { original: p } }) => <span className="num text-xs">{p.tapeWidth ? `${p.tapeWidth} mm / ${p.tapePitch} mm` : p.feeder}</span> },
  { id: 'aliases', header: 'Aliases', accessorFn: (p) => p.aliases.map((a) => a.pattern).join(' '), cell: ({ row: { original: p } }) => <span className="text-xs text-ink-600">{p.aliases.slice(0, 3).map((a) => a.pattern).join(', ')}{p.aliases.length > 3 ? ` +${p.aliases.length - 3}` : ''}</span> },
  { id: 'flags', header: '', enableSorting: false, accessorFn: (p) => (p.warnings.length ? 'warning' : ''), cell: ({ row: { original: p } }) => (p.warnings.length ? <span title={p.warnings.map((w) => w.message).join('\n')}><Badge tone="warning">check</Badge></span> : null) },
];

export default function PackagesRoute() {
  const q = usePackages();
  const access = useLibraryAccess();
  const navigate = useNavigate();
  const newButton = access.canEdit ? (
    <Button onClick={() => navigate('/library/packages/new')}>New package</Button>
  ) : access.canPropose ? (
    <Button onClick={() => navigate('/library/packages/new')}>Propose a package</Button>
  ) : null;
  return (
    <Loaded q={q} label="packages">
      {(items) =>
        items.length === 0 ? (
          <EmptyState title="The library has no packages yet" action={newButton}>
            {access.canEdit ? 'Add the first package, import a library file under Import & export, or load a CSV of packages.' : 'Ask a librarian to add packages, or propose one.'}
          </EmptyState>
        ) : (
          <DataTable<PackageDto>
            label="Packages"
            data={items}
            columns={columns}
            getRowId={(p) => p.id}
            onRowClick={(p) => navigate(`/library/packages/${p.id}`)}
            initialSorting={[{ id: 'name', desc: false }]}
            height={620}
            toolbar={newButton}
          />
        )
      }
    </Loaded>
  );
}
