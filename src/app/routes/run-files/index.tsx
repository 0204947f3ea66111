import { EmptyState, ErrorPanel, PageHeader, ProgressBar } from '../../../components/ui/misc';
import { useRunFiles } from '../../../features/run-files/api/run-files';
import { RunFileCard } from '../../../features/run-files/components/run-file-card';
import { SafetyNote } from '../../../features/run-files/components/safety-note';
import { orderRunFiles } from '../../../features/run-files/lib/order';

export default function RunFilesRoute() {
  const runFiles = useRunFiles();
  return (
    <div className="max-w-6xl">
      <PageHeader title="Run files" subtitle="Released placement lists for the line. Load the current revision; superseded ones stay here for reference." />
      <SafetyNote className="mb-6" />
      {runFiles.isPending ? (
        <ProgressBar label="Loading run files" />
      ) : runFiles.isError ? (
        <ErrorPanel error={runFiles.error} />
      ) : runFiles.data.length === 0 ? (
        <EmptyState title="No released programs yet — when an engineer releases a program, its run files appear here." />
      ) : (
        <div className="flex flex-col gap-8">
          {orderRunFiles(runFiles.data).map((p) => (
            <section key={p.programId} aria-label={`Program ${p.programName}`}>
              <h2 className="mb-2 flex flex-wrap items-baseline gap-x-3 text-lg font-semibold text-ink-900">
                {p.programName}
                <span className="text-sm font-normal text-ink-500">
                  {p.product} · {p.board}
                </span>
              </h2>
              <div className="flex flex-col gap-3">
                {p.entries.map((e) => (
                  <RunFileCard key={e.runFile.revisionId} entry={e} />
                ))}
              </div>
            </section>
          ))}
        </div>
      )}
    </div>
  );
}
