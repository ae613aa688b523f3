// The review thread at the foot of a build page: comments by anyone who may comment, a PI's
// verdict (approved / needs work, always with a comment), and the build's history of changes.
import { useState } from 'react';
import { useLocation, useNavigate } from 'react-router-dom';
import { useForm, type Resolver } from 'react-hook-form';
import { nextStatus, type BuildStatus } from '@shared/builds/status';
import { commentSchema, verdictSchema, type CommentBody, type VerdictBody } from '@shared/schemas/review';
import { Panel, ErrorNote, Loading } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { Field, Textarea } from '@/components/ui/field';
import { fieldLabel, formatDateTime, formatFieldValue } from '@/lib/format';
import { ApiError } from '@/lib/api-client';
import { schemaResolver } from '@/lib/schema-form';
import { useAddComment, useBuildAudit, useGiveVerdict, useReviews, type AuditEntry, type ReviewEntry } from '../api/reviews';

function VerdictMark({ verdict }: { verdict: 'approved' | 'needs-work' }) {
  const approved = verdict === 'approved';
  return (
    <span className={`inline-flex items-center gap-1 rounded-full px-2 py-0.5 text-xs font-medium ${approved ? 'bg-moss-100 text-moss-700' : 'bg-amber-100 text-amber-700'}`}>
      <svg aria-hidden width="10" height="10" viewBox="0 0 10 10">
        {approved ? <path d="M1.5 5.2 4 7.8 8.8 2.2" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" /> : <path d="M5 1.5v4.5M5 8v.5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />}
      </svg>
      {approved ? 'approved' : 'needs work'}
    </span>
  );
}

function Entry({ entry }: { entry: ReviewEntry }) {
  return (
    <li className="py-2.5">
      <div className="flex flex-wrap items-center gap-2 text-xs text-ink-500">
        <span className="font-medium text-ink-900">{entry.userName ?? `person ${entry.userId}`}</span>
        {entry.verdict && <VerdictMark verdict={entry.verdict} />}
        <span className="num">{formatDateTime(entry.createdAt)}</span>
      </div>
      <p className="mt-1 whitespace-pre-wrap text-sm text-ink-900">{entry.body}</p>
    </li>
  );
}

function History({ buildId }: { buildId: number }) {
  const { data, isLoading, error } = useBuildAudit(buildId, true);
  if (isLoading) return <Loading label="Loading the history…" />;
  if (error || !data) return <ErrorNote error={error} />;
  if (data.length === 0) return <p className="text-sm text-ink-500">No recorded changes.</p>;
  return (
    <table className="w-full text-sm" aria-label="Build history">
      <thead className="text-left text-xs text-ink-500">
        <tr><th className="py-1 font-medium">When</th><th className="font-medium">Who</th><th className="font-medium">What</th></tr>
      </thead>
      <tbody className="divide-y divide-line">
        {data.map((e: AuditEntry) => (
          <tr key={e.id} className="align-top">
            <td className="num whitespace-nowrap py-1.5 pr-3 text-ink-500">{formatDateTime(e.at)}</td>
            <td className="whitespace-nowrap pr-3 text-ink-700">{e.userName ?? 'system'}</td>
            <td className="text-ink-900">
              {e.changes.length > 0 ? (
                <ul>{e.changes.map((c) => <li key={c.field}><span className="text-ink-500">{fieldLabel(c.field)}:</span> <span className="num">{formatFieldValue(c.from)} → {formatFieldValue(c.to)}</span></li>)}</ul>
              ) : e.summary}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

type SendKind = 'comment' | 'approved' | 'needs-work';
interface ThreadFormValues {
  text: string;
  /** which button sent the text */
  kind: SendKind;
}

/** A comment is checked by the comment schema, a verdict by the verdict schema (a verdict always has its reason). */
const threadResolver: Resolver<ThreadFormValues> = (values, context, options) =>
  values.kind === 'comment'
    ? schemaResolver<ThreadFormValues, CommentBody>({ schema: commentSchema, toBody: (v) => ({ body: v.text }), fieldOf: () => 'text' })(values, context, options)
    : schemaResolver<ThreadFormValues, VerdictBody>({ schema: verdictSchema, toBody: (v) => ({ verdict: v.kind, body: v.text }), fieldOf: () => 'text' })(values, context, options);

export function ReviewThread({ buildId, projectId, permissions, status }: { buildId: number; projectId: number; permissions: { review: boolean; comment: boolean }; status: string }) {
  const thread = useReviews(buildId);
  const comment = useAddComment(buildId, projectId);
  const verdict = useGiveVerdict(buildId, projectId);
  const form = useForm<ThreadFormValues>({ defaultValues: { text: '', kind: 'comment' }, resolver: threadResolver });
  const [showHistory, setShowHistory] = useState(false);
  // the same transition rule the server applies to a verdict
  const canVerdict = permissions.review && nextStatus(status as BuildStatus, { kind: 'verdict' }).ok;
  const busy = comment.isPending || verdict.isPending;
  const serverError = (comment.error ?? verdict.error) as ApiError | null;

  const navigate = useNavigate();
  const arrivedAfterVerdict = (useLocation().state as { verdictSaved?: boolean } | null)?.verdictSaved === true;
  const reviews = thread.data?.reviews ?? [];
  const latestVerdict = [...reviews].reverse().find((r) => r.verdict);
  // the verdict that stands: giving it again would only repeat it (the server refuses that too)
  const standing = status === 'reviewed' ? latestVerdict?.verdict ?? null : null;

  const send = (kind: SendKind) => {
    form.setValue('kind', kind);
    void form.handleSubmit((checked) => {
      const body = checked as unknown as CommentBody | VerdictBody;
      if ('verdict' in body) {
        verdict.mutate(body, {
          onSuccess: (answer) => {
            form.reset({ text: '', kind: 'comment' });
            // clear the queue one build after another: the next one waiting opens
            if (answer.nextWaiting) navigate(`/projects/${answer.nextWaiting.projectId}/builds/${answer.nextWaiting.buildId}`, { state: { verdictSaved: true } });
          },
        });
      } else comment.mutate(body.body, { onSuccess: () => form.reset({ text: '', kind: 'comment' }) });
    })();
  };
  return (
    <Panel
      title={<span className="flex items-center gap-2">Review {latestVerdict?.verdict && <VerdictMark verdict={latestVerdict.verdict} />}</span>}
      className="mt-4"
      actions={<Button variant="ghost" onClick={() => setShowHistory((v) => !v)} aria-expanded={showHistory}>{showHistory ? 'Hide history' : 'Show history'}</Button>}
    >
      {arrivedAfterVerdict && <p role="status" className="mb-3 rounded-md bg-moss-100 px-3 py-2 text-sm text-moss-700">Your verdict was saved. This is the next build waiting for your review.</p>}
      {thread.isLoading ? <Loading /> : thread.error ? <ErrorNote error={thread.error} /> : (
        <>
          {reviews.length === 0 ? (
            <p className="text-sm text-ink-500">{permissions.review ? 'No comments yet. Give a verdict once the curves look right.' : 'No comments yet.'}</p>
          ) : (
            <ol className="divide-y divide-line" aria-label="Review thread">{reviews.map((r) => <Entry key={r.id} entry={r} />)}</ol>
          )}
          {(permissions.comment || permissions.review) ? (
            <div className="mt-3 space-y-2 border-t border-line pt-3">
              <Field label={canVerdict ? 'Comment or verdict' : 'Comment'} error={form.formState.errors.text?.message ?? serverError?.fields?.body} hint={canVerdict ? 'A verdict moves the build to reviewed and tells its author.' : undefined}>
                {(props) => <Textarea {...props} rows={3} {...form.register('text')} placeholder="What you see in the curves, what to try next…" />}
              </Field>
              {serverError && !serverError.fields?.body && <ErrorNote error={serverError} />}
              <div className="flex flex-wrap gap-2">
                {permissions.comment && <Button onClick={() => send('comment')} disabled={busy}>Add comment</Button>}
                {canVerdict && (
                  <>
                    <Button variant="primary" onClick={() => send('approved')} disabled={busy || standing === 'approved'}>{standing === 'approved' ? 'Approved' : 'Approve'}</Button>
                    <Button variant="danger" onClick={() => send('needs-work')} disabled={busy || standing === 'needs-work'}>{standing === 'needs-work' ? 'Marked: needs work' : 'Needs work'}</Button>
                  </>
                )}
              </div>
              {canVerdict && standing && <p className="text-xs text-ink-500">The verdict stands until someone changes it; a new curve of record sends the build back to review.</p>}
              {permissions.review && !canVerdict && <p className="text-xs text-ink-500">A verdict is possible once the build is made and tested (it is {status}).</p>}
            </div>
          ) : (
            <p className="mt-3 text-xs text-ink-500">Your role can read this thread but not comment.</p>
          )}
        </>
      )}
      {showHistory && <div className="mt-4 border-t border-line pt-3"><h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-500">History</h3><History buildId={buildId} /></div>}
    </Panel>
  );
}
