import { zodResolver } from '@hookform/resolvers/zod';
import { useId } from 'react';
import { useForm } from 'react-hook-form';
import { toast } from 'sonner';
import { problemReportInputSchema } from '../../../../shared/schemas/program.schema';
import { Button } from '../../../components/ui/button';
import { ApiError } from '../../../lib/api-client';
import { useReportProblem, type ProblemReportInput } from '../api/run-files';

/** "Report a problem" on one run file: goes to the program's author by e-mail and into the audit log. */
export function ProblemForm({ revisionId, what, onDone }: { revisionId: string; what: string; onDone: () => void }) {
  const report = useReportProblem(revisionId);
  const form = useForm<ProblemReportInput>({ resolver: zodResolver(problemReportInputSchema), defaultValues: { text: '' } });
  const id = useId();
  const error = form.formState.errors.text?.message;
  const onSubmit = form.handleSubmit((v) =>
    report.mutate(v, {
      onSuccess: () => {
        toast.success(`Thanks — the author of ${what} has been told.`);
        form.reset();
        onDone();
      },
      onError: (err) => {
        const field = err instanceof ApiError ? err.fieldError('text') : undefined;
        if (field) form.setError('text', { message: field });
        else toast.error(err.message);
      },
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Report a problem with ${what}`} className="no-print mt-3 flex flex-col gap-2 border-t border-ink-100 pt-3">
      <label htmlFor={id} className="text-xs font-medium text-ink-700">
        What went wrong?
      </label>
      <div className="flex items-start gap-3">
        <textarea
          id={id}
          rows={3}
          aria-invalid={error ? true : undefined}
          aria-describedby={`${id}-msg`}
          placeholder="For example: D3 sits 0.4 mm left of its pads on every board in column 2."
          className={`w-full max-w-2xl rounded border bg-white px-2 py-1.5 text-sm ${error ? 'border-sev-error' : 'border-ink-300'} focus:border-copper-400`}
          {...form.register('text')}
        />
        <p id={`${id}-msg`} role={error ? 'alert' : undefined} className={`w-56 shrink-0 pt-1 text-xs ${error ? 'text-sev-error' : 'text-ink-500'}`}>
          {error ?? 'The program’s author gets it by e-mail. Name the part, board and what you saw.'}
        </p>
      </div>
      <div className="flex gap-2">
        <Button type="submit" disabled={report.isPending}>{report.isPending ? 'Sending…' : 'Send report'}</Button>
        <Button variant="ghost" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}
