import { Link, useParams } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { ErrorPanel, ProgressBar } from '../../../components/ui/misc';
import { useRunFiles, useSetupSheet } from '../../../features/run-files/api/run-files';
import { SetupSheetView } from '../../../features/run-files/components/setup-sheet-view';

export default function SetupSheetRoute() {
  const { revisionId = '' } = useParams();
  const sheet = useSetupSheet(revisionId);
  // The list gives the CSV checksums too (the sheet's own data carries the JSON lists only).
  const runFiles = useRunFiles();
  const files = runFiles.data?.find((r) => r.revisionId === revisionId)?.files;
  return (
    <div>
      <div className="no-print mb-4 flex items-center gap-3">
        <Link to="/run-files" className="text-sm text-copper-700 hover:underline">
          ← Run files
        </Link>
        <Button className="ml-auto" onClick={() => window.print()} disabled={!sheet.data}>
          Print
        </Button>
      </div>
      {sheet.isPending ? <ProgressBar label="Loading the set-up sheet" /> : sheet.isError ? <ErrorPanel error={sheet.error} /> : <SetupSheetView sheet={sheet.data} files={files} />}
    </div>
  );
}
