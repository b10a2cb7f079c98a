import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CheckCheck, Send, Undo2 } from 'lucide-react';
import type { SurveyAbilities, SurveyStatus } from '@shared/schemas/surveys';
import { returnSurveyBodySchema, type ReturnSurveyBody } from '@shared/schemas/workflow';
import { formatDateTime } from '@shared/datetime';
import { Button } from '@/components/ui/button';
import { TextAreaField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useSubmitSurvey } from '../api/submit-survey';
import { useSignOffSurvey } from '../api/sign-off-survey';
import { useReturnSurvey } from '../api/return-survey';

/** The signed record as the verdicts answer it (names, times, the site's zone). */
export type SignedRecord = { submittedByName: string | null; submittedAt: string | null; signedOffByName: string | null; signedOffAt: string | null; siteTimeZone: string };

type Props = { surveyId: number; status: SurveyStatus; abilities: SurveyAbilities; reviewComment: string | null; record?: SignedRecord; onChanged?: () => unknown };

/** Submit, sign off or return with a comment, as the survey's abilities (from the server) allow; once signed off, the signed record. */
export function WorkflowActions({ surveyId, status, abilities, reviewComment, record, onChanged }: Props) {
  const submit = useSubmitSurvey();
  const signOff = useSignOffSurvey();
  const giveBack = useReturnSurvey();
  const [mode, setMode] = useState<'idle' | 'sign' | 'return'>('idle');
  const [signComment, setSignComment] = useState('');
  const form = useForm<ReturnSurveyBody>({ resolver: zodResolver(returnSurveyBodySchema), defaultValues: { comment: '' } });
  const done = async () => { setMode('idle'); await onChanged?.(); };

  const canSubmit = abilities.submit;
  const canReview = abilities.signOff || abilities.return;

  return (
    <div className="space-y-3">
      {status === 'returned' && reviewComment && <p className="rounded-lg bg-unsure-50 p-3 text-sm text-unsure-700 ring-1 ring-unsure-100"><strong>Returned:</strong> {reviewComment}</p>}
      {status === 'signed_off' && (
        <div className="space-y-2 text-sm">
          <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]" aria-label="Signed record">
            <dt className="text-ink-500">Signed off by</dt><dd className="font-medium">{record?.signedOffByName ?? 'unknown'}</dd>
            <dt className="text-ink-500">Signed off on</dt><dd className="num">{record?.signedOffAt ? formatDateTime(record.signedOffAt, record.siteTimeZone) : '–'}</dd>
            <dt className="text-ink-500">Comment</dt><dd>{reviewComment?.trim() ? reviewComment : <span className="text-ink-500">none given</span>}</dd>
            {record?.submittedByName && <><dt className="text-ink-500">Submitted by</dt><dd>{record.submittedByName}{record.submittedAt ? `, ${formatDateTime(record.submittedAt, record.siteTimeZone)}` : ''}</dd></>}
          </dl>
          <p className="text-ink-600">Read-only: verdicts, targets, coefficient sets and the decision rule are frozen.</p>
        </div>
      )}
      {status === 'submitted' && record?.submittedByName && <p className="text-sm text-ink-600">Submitted by {record.submittedByName}{record.submittedAt ? ` on ${formatDateTime(record.submittedAt, record.siteTimeZone)}` : ''}.</p>}
      {status === 'submitted' && abilities.return && !abilities.signOff && <p className="text-sm text-ink-600">You submitted this survey, so another reviewer signs it off (four-eyes rule). You can still return it.</p>}
      <FormError error={submit.error ?? signOff.error ?? giveBack.error} />
      <div className="flex flex-wrap gap-2">
        {canSubmit && <Button busy={submit.isPending} onClick={() => submit.mutate({ surveyId }, { onSuccess: done })}><Send className="h-4 w-4" aria-hidden />Submit for review</Button>}
        {canReview && mode === 'idle' && (
          <>
            {abilities.signOff && <Button onClick={() => setMode('sign')}><CheckCheck className="h-4 w-4" aria-hidden />Sign off…</Button>}
            {abilities.return && <Button variant="secondary" onClick={() => setMode('return')}><Undo2 className="h-4 w-4" aria-hidden />Return with comment…</Button>}
          </>
        )}
      </div>
      {abilities.signOff && mode === 'sign' && (
        <form className="space-y-3" onSubmit={(e) => { e.preventDefault(); signOff.mutate({ surveyId, ...(signComment.trim() ? { comment: signComment.trim() } : {}) }, { onSuccess: done }); }}>
          <TextAreaField label="Comment (optional)" rows={2} value={signComment} onChange={(e) => setSignComment(e.target.value)} hint="Signing off freezes the verdicts and e-mails the report to the surveyor and to you." />
          <div className="flex gap-2">
            <Button type="submit" busy={signOff.isPending}><CheckCheck className="h-4 w-4" aria-hidden />Confirm sign-off</Button>
            <Button type="button" variant="ghost" onClick={() => setMode('idle')}>Cancel</Button>
          </div>
        </form>
      )}
      {abilities.return && mode === 'return' && (
        <form className="space-y-3" onSubmit={form.handleSubmit((body) => giveBack.mutate({ surveyId, ...body }, { onSuccess: done }))}>
          <TextAreaField label="What should the surveyor change?" rows={3} error={form.formState.errors.comment?.message} {...form.register('comment')} />
          <div className="flex gap-2">
            <Button type="submit" variant="secondary" busy={giveBack.isPending}><Undo2 className="h-4 w-4" aria-hidden />Return survey</Button>
            <Button type="button" variant="ghost" onClick={() => setMode('idle')}>Cancel</Button>
          </div>
        </form>
      )}
    </div>
  );
}
