import type { ReactNode } from 'react';
import type { ReleaseFileDto } from '../../../../shared/schemas/program.schema';
import type { SetupSheetDto } from '../../../../shared/schemas/run-file.schema';
import { Badge } from '../../../components/ui/misc';
import { dateTime, mm } from '../../../lib/format';
import { sideLabel } from '../lib/format';
import { boardsOf, groupParts, nozzleCounts, perBoardText, visionCounts } from '../lib/setup-sheet';
import { Sha256 } from './copy-button';
import { ChecksumNote } from './run-file-card';
import { SafetyNote } from './safety-note';

/** Print rules: no navigation, black on white, each side on its own page. */
const PRINT_CSS = `
@media print {
  @page { size: A4; margin: 12mm; }
  html, body { background: #fff !important; }
  aside:not(.safety-note), nav, .no-print, [data-sonner-toaster] { display: none !important; }
  main { padding: 0 !important; }
  .setup-sheet, .setup-sheet * { color: #000 !important; background: transparent !important; box-shadow: none !important; }
  .setup-sheet table, .setup-sheet th, .setup-sheet td, .setup-sheet .safety-note, .setup-sheet .sheet-box { border-color: #000 !important; }
  .setup-sheet .side-page + .side-page { break-before: page; }
  .setup-sheet tr, .setup-sheet .sheet-box { break-inside: avoid; }
  .setup-sheet thead { display: table-header-group; }
  .setup-sheet .text-sm, .setup-sheet td, .setup-sheet dd { font-size: 9pt !important; line-height: 1.3 !important; }
  .setup-sheet .text-xs, .setup-sheet th, .setup-sheet dt { font-size: 7.5pt !important; }
  .setup-sheet td, .setup-sheet th { padding: 2px 4px !important; }
}
`;

const th = 'border-b border-ink-300 px-2 py-1 text-left text-xs font-medium text-ink-600';
const td = 'border-b border-ink-100 px-2 py-1 align-top';
const tdNum = `${td} num whitespace-nowrap`;

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-2xs font-medium uppercase tracking-wide text-ink-500">{label}</dt>
      <dd className="text-sm text-ink-900">{children}</dd>
    </div>
  );
}

export function SetupSheetView({ sheet, files }: { sheet: SetupSheetDto; files?: ReleaseFileDto[] }) {
  const { program, revision, machine, sides } = sheet;
  const machineNozzles = new Set(machine?.nozzles ?? []);
  return (
    <div className="setup-sheet max-w-6xl text-ink-900">
      <style>{PRINT_CSS}</style>
      <header className="mb-4 border-b-2 border-ink-800 pb-3">
        <p className="text-2xs font-medium uppercase tracking-widest text-ink-500">Set-up sheet</p>
        <h1 className="text-2xl font-semibold">
          {program.name} <span className="num">{revision.label}</span>
        </h1>
        {revision.state === 'superseded' && (
          <p className="mt-1 text-sm font-semibold text-sev-error">This revision is superseded. Load the current revision from Run files instead.</p>
        )}
        <dl className="mt-3 grid grid-cols-2 gap-x-6 gap-y-2 sm:grid-cols-4 print:grid-cols-4">
          <Fact label="Program">{program.name}</Fact>
          <Fact label="Product">{program.product}</Fact>
          <Fact label="Board">{program.board}</Fact>
          <Fact label="Revision">
            <span className="num">{revision.label}</span> <Badge tone={revision.state === 'released' ? 'mask' : 'neutral'}>{revision.state}</Badge>
          </Fact>
          <Fact label="Released">
            <span className="num whitespace-nowrap">{dateTime(revision.releasedAt)}</span>
          </Fact>
          <Fact label="Sides">{sides.map((s) => sideLabel(s.side)).join(' and ') || '—'}</Fact>
        </dl>
      </header>

      <section aria-label="Checksums" className="sheet-box mb-4">
        <h2 className="mb-1 text-sm font-semibold">SHA-256 of the lists</h2>
        <table className="w-full border-collapse text-sm">
          <tbody>
            {(files?.length ? files : sides.map((s) => ({ side: s.side, format: 'json' as const, sha256: s.sha256 }))).map((f) => (
              <tr key={`${f.side}.${f.format}`}>
                <td className={`${td} w-32 whitespace-nowrap font-medium`}>
                  {sideLabel(f.side)} {f.format.toUpperCase()}
                </td>
                <td className={td}>
                  <Sha256 value={f.sha256} what={`the ${f.side} ${f.format.toUpperCase()} list`} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <ChecksumNote />
      </section>

      <div className="mb-4 grid gap-4 md:grid-cols-2 print:grid-cols-2">
        <section aria-label="Machine" className="sheet-box rounded border border-ink-200 p-3">
          <h2 className="mb-1 text-sm font-semibold">Machine profile</h2>
          {machine ? (
            <dl className="grid grid-cols-2 gap-2">
              <Fact label="Name">{machine.name ?? '—'}</Fact>
              <Fact label="Reach">
                <span className="num">
                  {mm(machine.reachX, 0)} × {mm(machine.reachY, 0)}
                </span>
              </Fact>
              <div className="col-span-2">
                <Fact label="Nozzles on the machine">
                  <span className="num">{machine.nozzles.length ? machine.nozzles.join(', ') : '—'}</span>
                </Fact>
              </div>
            </dl>
          ) : (
            <p className="text-sm text-ink-600">No machine profile was set for this program.</p>
          )}
        </section>
        <SafetyNote />
      </div>

      {sides.map(({ side, list }) => {
        const groups = groupParts(list.placements);
        const nozzles = nozzleCounts(list.placements);
        const vision = visionCounts(list.placements);
        const boards = boardsOf(list);
        return (
          <section key={side} aria-label={`${sideLabel(side)} side`} className="side-page mt-6">
            <h2 className="border-b border-ink-800 pb-1 text-lg font-semibold">
              {sideLabel(side)} side
              <span className="ml-3 text-sm font-normal text-ink-600">
                <span className="num">{list.meta.placements}</span> placements on <span className="num">{boards}</span> boards ·{' '}
                {list.meta.frame === 'machine' ? 'machine frame (fiducial transform applied)' : 'panel frame'} · {program.name} <span className="num">{revision.label}</span>
              </span>
            </h2>

            <div className="mt-3 grid gap-4 md:grid-cols-3 print:grid-cols-3">
              <div className="sheet-box">
                <h3 className="mb-1 text-sm font-semibold">Fiducials</h3>
                {list.fiducials.length ? (
                  <table aria-label={`${sideLabel(side)} fiducials`} className="w-full border-collapse text-sm">
                    <thead>
                      <tr>
                        <th className={th}>Name</th>
                        <th className={`${th} text-right`}>X</th>
                        <th className={`${th} text-right`}>Y</th>
                      </tr>
                    </thead>
                    <tbody>
                      {list.fiducials.map((f) => (
                        <tr key={f.name}>
                          <td className={`${td} num`}>{f.name}</td>
                          <td className={`${tdNum} text-right`}>{mm(f.x)}</td>
                          <td className={`${tdNum} text-right`}>{mm(f.y)}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                ) : (
                  <p className="text-sm text-ink-600">No fiducials: positions are in the panel frame.</p>
                )}
              </div>
              <div className="sheet-box">
                <h3 className="mb-1 text-sm font-semibold">Nozzles needed</h3>
                <table aria-label={`${sideLabel(side)} nozzles`} className="w-full border-collapse text-sm">
                  <thead>
                    <tr>
                      <th className={th}>Nozzle</th>
                      <th className={`${th} text-right`}>Placements</th>
                      <th className={th}><span className="sr-only">On the machine</span></th>
                    </tr>
                  </thead>
                  <tbody>
                    {nozzles.map((n) => (
                      <tr key={n.name}>
                        <td className={`${td} num`}>{n.name}</td>
                        <td className={`${td} num text-right`}>{n.count}</td>
                        <td className={`${td} text-xs`}>{machine && !machineNozzles.has(n.name) ? <span className="font-semibold text-sev-error">not on the machine</span> : null}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
              <div className="sheet-box">
                <h3 className="mb-1 text-sm font-semibold">Vision presets used</h3>
                <table aria-label={`${sideLabel(side)} vision presets`} className="w-full border-collapse text-sm">
                  <thead>
                    <tr>
                      <th className={th}>Preset</th>
                      <th className={`${th} text-right`}>Placements</th>
                    </tr>
                  </thead>
                  <tbody>
                    {vision.map((v) => (
                      <tr key={v.name}>
                        <td className={`${td} num`}>{v.name}</td>
                        <td className={`${td} num text-right`}>{v.count}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            </div>

            <h3 className="mb-1 mt-4 text-sm font-semibold">Parts by package and value</h3>
            <table aria-label={`${sideLabel(side)} parts`} className="w-full border-collapse text-sm">
              <thead>
                <tr>
                  <th className={th}>Package</th>
                  <th className={th}>Value</th>
                  <th className={th}>Part number</th>
                  <th className={th}>Nozzle</th>
                  <th className={th}>Vision</th>
                  <th className={`${th} text-right`}>Per board</th>
                  <th className={`${th} text-right`}>Per panel</th>
                  <th className={th}>References (one board)</th>
                </tr>
              </thead>
              <tbody>
                {groups.map((g) => (
                  <tr key={`${g.package}|${g.value}`}>
                    <td className={`${td} num whitespace-nowrap`}>{g.package}</td>
                    <td className={`${td} whitespace-nowrap`}>{g.value || '—'}</td>
                    <td className={`${tdNum} text-xs`}>{g.partNumbers.join(', ') || '—'}</td>
                    <td className={`${td} num`}>{g.nozzle ?? '—'}</td>
                    <td className={`${tdNum} text-xs`}>{g.vision ?? '—'}</td>
                    <td className={`${td} num text-right`}>{perBoardText(g)}</td>
                    <td className={`${td} num text-right font-semibold`}>{g.perPanel}</td>
                    <td className={`${td} num text-xs text-ink-600`}>{g.refs.join(' ')}</td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                <tr>
                  <td className="px-2 py-1 text-xs font-medium" colSpan={6}>
                    Total
                  </td>
                  <td className="num px-2 py-1 text-right font-semibold">{list.placements.length}</td>
                  <td />
                </tr>
              </tfoot>
            </table>
          </section>
        );
      })}
      {sides.length === 0 && <p className="mt-6 text-sm text-ink-600">This release has no placement lists.</p>}
    </div>
  );
}
