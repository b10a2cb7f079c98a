import { useRef, useState } from 'react';
import { CheckCircle2, FileDown, FileUp, ShieldCheck, Trash2 } from 'lucide-react';
import type { CoefficientSetDto } from '@shared/schemas/coefficient-sets';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { ConfirmAction } from '@/components/ui/confirm-action';
import { FormError } from '@/components/ui/form-error';
import { useApproveCoefficientSet } from '../api/approve-coefficient-set';
import { useDiscardCoefficientSet } from '../api/discard-coefficient-set';
import { useUploadCertificate } from '../api/upload-certificate';
import { apiFiles } from '@shared/paths';
import { GainCoefficientsTable } from './gain-coefficients-table';
import { formatDueDate, formatInstant, sig } from './format';

function SetCard({ set, userId, canWrite, canApprove }: { set: CoefficientSetDto; userId: number; canWrite: boolean; canApprove: boolean }) {
  const approve = useApproveCoefficientSet();
  const discard = useDiscardCoefficientSet();
  const upload = useUploadCertificate();
  const fileInput = useRef<HTMLInputElement>(null);
  const [confirmDiscard, setConfirmDiscard] = useState(false);
  const isDraft = set.status === 'draft';
  const ownDraft = set.draftedBy?.id === userId;
  return (
    <li className="rounded-lg p-4 ring-1 ring-ink-100" aria-label={`Version ${set.version}`}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <div className="flex flex-wrap items-center gap-2">
            <h3 className="text-sm font-semibold text-ink-900">Version {set.version}</h3>
            {isDraft ? <Badge tone="unsure">Draft</Badge> : <Badge tone="good" icon={<ShieldCheck className="h-3.5 w-3.5" aria-hidden />}>Approved</Badge>}
            {set.inForce && <Badge tone="info" icon={<CheckCircle2 className="h-3.5 w-3.5" aria-hidden />}>In force now</Badge>}
          </div>
          <p className="mt-1 text-sm text-ink-600">
            Effective from <span className="num">{formatInstant(set.effectiveFrom)}</span> · due <span className="num">{formatDueDate(set.dueDate)}</span> · certificate {set.certificateNumber}
          </p>
          <p className="text-xs text-ink-500">
            Drafted by {set.draftedBy?.name ?? 'an import'} on {formatInstant(set.createdAt)}
            {set.approvedBy ? ` · approved by ${set.approvedBy.name} on ${formatInstant(set.approvedAt)}` : ''}
            {set.benchRunId ? ` · from bench run #${set.benchRunId}` : ''}
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {set.certificate && (
            <a href={apiFiles.certificate(set.id)} className="inline-flex items-center gap-1.5 rounded-lg px-2.5 py-1.5 text-sm font-medium text-ink-700 ring-1 ring-inset ring-ink-200 hover:bg-ink-50">
              <FileDown className="h-4 w-4" aria-hidden />Certificate PDF
            </a>
          )}
          {isDraft && canWrite && (
            <>
              <input ref={fileInput} type="file" accept="application/pdf" className="sr-only" aria-label={`Certificate PDF for version ${set.version}`}
                onChange={(e) => { const f = e.target.files?.[0]; if (f) upload.mutate({ id: set.id, file: f }); e.target.value = ''; }} />
              <Button variant="secondary" size="sm" busy={upload.isPending} onClick={() => fileInput.current?.click()}>
                <FileUp className="h-4 w-4" aria-hidden />{set.certificate ? 'Replace certificate' : 'Attach certificate'}
              </Button>
            </>
          )}
          {isDraft && canApprove && (
            <ConfirmAction busy={approve.isPending} disabled={ownDraft} title={ownDraft ? 'You drafted this set: a colleague must approve it' : undefined}
              trigger={<><ShieldCheck className="h-4 w-4" aria-hidden />Approve version {set.version}…</>}
              consequence={<>Approving version {set.version} makes it decode this probe's readings from {formatInstant(set.effectiveFrom)} on. An approved set can never be changed or discarded: a correction is a new version.</>}
              confirmLabel={<><ShieldCheck className="h-4 w-4" aria-hidden />Approve for good</>}
              onConfirm={() => approve.mutate(set.id)} />
          )}
          {isDraft && canWrite && (confirmDiscard ? (
            <>
              <Button variant="danger" size="sm" busy={discard.isPending} onClick={() => discard.mutate({ id: set.id, probeId: set.probeId })}>Discard for good</Button>
              <Button variant="ghost" size="sm" onClick={() => setConfirmDiscard(false)}>Keep</Button>
            </>
          ) : (
            <Button variant="ghost" size="sm" onClick={() => setConfirmDiscard(true)}><Trash2 className="h-4 w-4" aria-hidden />Discard draft</Button>
          ))}
        </div>
      </div>
      {isDraft && ownDraft && canApprove && (
        <p className="mt-2 text-xs text-ink-600">Four-eyes rule: you drafted this set, so a colleague in calibration or an administrator approves it.</p>
      )}
      <div className="mt-3 space-y-2">
        <FormError error={approve.error ?? upload.error ?? discard.error} />
        <details>
          <summary className="cursor-pointer text-sm font-medium text-ink-700">Coefficients (t<sub>ref</sub> {sig(set.tRefMs)} ms, α {sig(set.alphaPerK, 3)} /K, T<sub>cal</sub> {sig(set.tCalC, 3)} °C)</summary>
          <div className="mt-2"><GainCoefficientsTable gains={set.gains} caption={`Coefficients of version ${set.version}`} /></div>
          {set.note && <p className="mt-2 text-sm text-ink-600">{set.note}</p>}
        </details>
      </div>
    </li>
  );
}

/** Every version of a probe's sets, newest first. Approved versions never change. */
export function CoefficientSetList({ sets, userId, canWrite, canApprove }: { sets: CoefficientSetDto[]; userId: number; canWrite: boolean; canApprove: boolean }) {
  return (
    <ul className="space-y-3">
      {sets.map((s) => <SetCard key={s.id} set={s} userId={userId} canWrite={canWrite} canApprove={canApprove} />)}
    </ul>
  );
}
