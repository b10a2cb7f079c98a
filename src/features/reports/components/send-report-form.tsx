import { useState } from 'react';
import { Mail } from 'lucide-react';
import { sendReportBodySchema } from '@shared/schemas/reports';
import { Button } from '@/components/ui/button';
import { TextAreaField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useSendReport } from '../api/send-report';

/** E-mails the PDF report to the addresses given (comma, semicolon or one per line). */
export function SendReportForm({ surveyId }: { surveyId: number }) {
  const send = useSendReport();
  const [recipients, setRecipients] = useState('');
  const [message, setMessage] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        const list = recipients.split(/[\s,;]+/).filter(Boolean);
        const body = sendReportBodySchema.safeParse({ recipients: list, ...(message.trim() ? { message } : {}) });
        if (!body.success) {
          const issue = body.error.issues[0];
          setProblem(issue.path[0] === 'recipients' && typeof issue.path[1] === 'number' ? `"${list[issue.path[1]]}" is not an e-mail address` : issue.message);
          return;
        }
        setProblem(null);
        send.mutate({ surveyId, ...body.data }, { onSuccess: () => { setRecipients(''); setMessage(''); } });
      }}
    >
      <TextField label="Recipients" placeholder="estates@example.test, board@example.test" value={recipients} onChange={(e) => setRecipients(e.target.value)} error={problem ?? undefined} />
      <TextAreaField label="Message (optional)" rows={2} value={message} onChange={(e) => setMessage(e.target.value)} />
      <FormError error={send.error} />
      {send.isSuccess && <p role="status" className="text-sm text-meets-700">Queued {send.data.filename} for {send.data.sentTo.join(', ')}: the report is built and sent in the background.</p>}
      <Button type="submit" variant="secondary" busy={send.isPending}><Mail className="h-4 w-4" aria-hidden />Send report</Button>
    </form>
  );
}
