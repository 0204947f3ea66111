import { NavLink, Outlet } from 'react-router-dom';
import { PageHeader } from '../../../components/ui/misc';
import { useProposals } from '../../../features/library/api/proposals';
import { LIBRARY_EXPORT_URL } from '../../../features/library/api/transfer';
import { useUnmatched } from '../../../features/library/api/unmatched';
import { useLibraryAccess } from '../../../features/library/hooks/use-library-access';

const TABS = [
  { to: 'packages', label: 'Packages' },
  { to: 'aliases', label: 'Aliases' },
  { to: 'nozzles', label: 'Nozzles' },
  { to: 'vision-presets', label: 'Vision presets' },
  { to: 'machines', label: 'Machines' },
  { to: 'proposals', label: 'Proposals' },
  { to: 'unmatched', label: 'Unmatched' },
  { to: 'transfer', label: 'Import & export' },
];

/** The Library section: a header with the export, and one tab per kind of thing. */
export default function LibraryLayout() {
  const access = useLibraryAccess();
  const proposals = useProposals();
  const unmatched = useUnmatched();
  const counts: Record<string, number> = {
    proposals: proposals.data?.filter((p) => p.status === 'open').length ?? 0,
    unmatched: unmatched.data?.filter((u) => u.status === 'open').length ?? 0,
  };
  return (
    <div className="max-w-[1400px]">
      <PageHeader
        title="Library"
        subtitle={
          access.canEdit
            ? 'The shared package library every program matches its footprints against. Your edits apply to the next check of every program.'
            : access.canPropose
              ? 'The shared package library. You can read everything here and propose new packages, aliases and changes to the librarians.'
              : 'The shared package library, read only.'
        }
        actions={
          <a href={LIBRARY_EXPORT_URL} download className="inline-flex items-center gap-1.5 rounded border border-ink-300 bg-white px-3 py-1.5 text-sm font-medium text-ink-800 hover:bg-ink-100">
            Export library file
          </a>
        }
      />
      <nav aria-label="Library sections" className="mb-4 flex flex-wrap gap-1 border-b border-ink-200">
        {TABS.map((t) => (
          <NavLink
            key={t.to}
            to={t.to}
            className={({ isActive }) =>
              `-mb-px flex items-center gap-1.5 border-b-2 px-3 py-2 text-sm ${isActive ? 'border-copper-500 font-medium text-ink-900' : 'border-transparent text-ink-500 hover:text-ink-800'}`
            }
          >
            {t.label}
            {counts[t.to] ? <span className="num rounded-full bg-copper-100 px-1.5 text-2xs text-copper-800">{counts[t.to]}</span> : null}
          </NavLink>
        ))}
      </nav>
      <Outlet />
    </div>
  );
}
