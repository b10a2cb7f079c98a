import { useState } from 'react';
import type { UseFormRegister, FieldErrors } from 'react-hook-form';
import { createCoefficientSetBodySchema, type CreateCoefficientSetBody } from '@shared/schemas/coefficient-sets';
import { TextAreaField, TextField } from '@/components/ui/field';
import { dayFromToday, dueDateToIso, localToIso, nowLocalInput } from './format';

/** Fields every draft has, as the inputs hold them (local date-time, calendar day). */
export type DraftHeaderValues = { effectiveFromLocal: string; dueDay: string; certificateNumber: string; note: string };

export const draftHeaderDefaults = (): DraftHeaderValues => ({ effectiveFromLocal: nowLocalInput(), dueDay: dayFromToday(365), certificateNumber: '', note: '' });

export const draftHeaderToBody = (v: DraftHeaderValues) => ({
  effectiveFrom: localToIso(v.effectiveFromLocal), dueDate: dueDateToIso(v.dueDay), certificateNumber: v.certificateNumber, note: v.note,
});

/** Checks a draft body with the server's own schema; returns its messages by field path. */
export function useDraftCheck() {
  const [problems, setProblems] = useState<{ path: string; message: string }[]>([]);
  const check = (body: CreateCoefficientSetBody): boolean => {
    const r = createCoefficientSetBodySchema.safeParse(body);
    setProblems(r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })));
    return r.success;
  };
  return { problems, check, messageFor: (path: string) => problems.find((p) => p.path === path)?.message };
}

export function DraftHeaderFields({ register, errors, messageFor }: {
  register: UseFormRegister<DraftHeaderValues>; errors: FieldErrors<DraftHeaderValues>; messageFor: (path: string) => string | undefined;
}) {
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <TextField label="Effective from" type="datetime-local" hint="Readings at or after this moment decode with this set once approved" {...register('effectiveFromLocal', { required: 'Choose when the set takes effect' })} error={errors.effectiveFromLocal?.message ?? messageFor('effectiveFrom')} />
      <TextField label="Due date" type="date" hint="Valid through the end of this day (UTC)" {...register('dueDay', { required: 'Choose the due date' })} error={errors.dueDay?.message ?? messageFor('dueDate')} />
      <TextField label="Certificate number" autoComplete="off" {...register('certificateNumber', { required: 'Enter the certificate number' })} error={errors.certificateNumber?.message ?? messageFor('certificateNumber')} />
      <TextAreaField label="Note (optional)" rows={2} {...register('note')} />
    </div>
  );
}
