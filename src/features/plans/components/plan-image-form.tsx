import { useState, type FormEvent } from 'react';
import { ImageUp } from 'lucide-react';
import { PLAN_IMAGE_MAX_BYTES, type Plan } from '@shared/schemas/plans';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { ProgressBar } from '@/components/ui/progress-bar';
import { useReplacePlanImage } from '../api/replace-plan-image';

/** Replace a plan's image with a revised drawing of the same floor; the plan keeps its width in metres. */
export function PlanImageForm({ plan }: { plan: Plan }) {
  const replace = useReplacePlanImage();
  const [file, setFile] = useState<File | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [done, setDone] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setProblem(null);
    setDone(false);
    if (!file) return setProblem('Choose the new image');
    if (file.size > PLAN_IMAGE_MAX_BYTES) return setProblem(`The image is larger than ${PLAN_IMAGE_MAX_BYTES / 1024 / 1024} MB; export it at a lower resolution`);
    try {
      await replace.mutateAsync({ planId: plan.id, file, onProgress: (p) => setProgress(p.fraction) });
      setFile(null);
      (e.target as HTMLFormElement).reset();
      setDone(true);
    } catch (err) {
      setProblem(err instanceof Error ? err.message : 'The upload failed');
    } finally {
      setProgress(null);
    }
  }

  return (
    <form aria-label="Replace the plan image" onSubmit={submit} className="space-y-3" noValidate>
      <div>
        <label htmlFor="plan-image-file" className="mb-1 block text-sm font-medium text-ink-800">New image</label>
        <input id="plan-image-file" type="file" accept="image/png,image/jpeg,image/webp" onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          aria-invalid={problem !== null || undefined}
          className="block w-full text-sm file:mr-3 file:rounded-lg file:border-0 file:bg-ink-900 file:px-3 file:py-2 file:text-sm file:font-medium file:text-white" />
        <p className="mt-1 text-xs text-ink-500">
          {plan.widthM ? `The plan stays ${Math.round(plan.widthM * 100) / 100} m wide, so zones and readings keep their place; use the same drawing with the same proportions.` : 'PNG, JPEG or WebP of the same floor.'}
        </p>
      </div>
      {progress !== null && <ProgressBar value={progress} label="Uploading" />}
      {problem && <FormError error={new Error(problem)} />}
      {done && <p role="status" className="text-sm text-meets-700">The plan image was replaced.</p>}
      <Button type="submit" variant="secondary" busy={replace.isPending}><ImageUp className="h-4 w-4" aria-hidden />Replace image</Button>
    </form>
  );
}
