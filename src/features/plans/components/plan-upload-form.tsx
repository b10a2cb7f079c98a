import { useState, type FormEvent } from 'react';
import { Upload } from 'lucide-react';
import { createPlanFieldsSchema, PLAN_IMAGE_MAX_BYTES, type Plan } from '@shared/schemas/plans';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { ProgressBar } from '@/components/ui/progress-bar';
import { useUploadPlan } from '../api/upload-plan';

/** Upload a plan image (PNG, JPEG, WebP) with a name and, if known, its width in metres. */
export function PlanUploadForm({ siteId, onUploaded }: { siteId: number; onUploaded?: (plan: Plan) => void }) {
  const upload = useUploadPlan();
  const [file, setFile] = useState<File | null>(null);
  const [name, setName] = useState('');
  const [width, setWidth] = useState('');
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<{ field?: string; message: string } | null>(null);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setProblem(null);
    if (!file) return setProblem({ field: 'file', message: 'Choose the plan image' });
    if (file.size > PLAN_IMAGE_MAX_BYTES) return setProblem({ field: 'file', message: `The image is larger than ${PLAN_IMAGE_MAX_BYTES / 1024 / 1024} MB; export it at a lower resolution` });
    const parsed = createPlanFieldsSchema.safeParse({ name, widthM: width });
    if (!parsed.success) return setProblem({ field: String(parsed.error.issues[0].path[0]), message: parsed.error.issues[0].message });
    try {
      const plan = await upload.mutateAsync({ siteId, file, name: parsed.data.name, widthM: parsed.data.widthM, onProgress: (p) => setProgress(p.fraction) });
      setFile(null); setName(''); setWidth('');
      (e.target as HTMLFormElement).reset();
      onUploaded?.(plan);
    } catch (err) {
      setProblem({ message: err instanceof Error ? err.message : 'The upload failed' });
    } finally {
      setProgress(null);
    }
  }

  return (
    <form aria-label="Upload a plan" onSubmit={submit} className="grid gap-3 sm:grid-cols-2" noValidate>
      <div className="sm:col-span-2">
        <label htmlFor="plan-file" className="mb-1 block text-sm font-medium text-ink-800">Plan image</label>
        <input id="plan-file" type="file" accept="image/png,image/jpeg,image/webp" onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          aria-invalid={problem?.field === 'file' || undefined}
          className="block w-full text-sm file:mr-3 file:rounded-lg file:border-0 file:bg-ink-900 file:px-3 file:py-2 file:text-sm file:font-medium file:text-white" />
        <p className="mt-1 text-xs text-ink-500">PNG, JPEG or WebP, up to {PLAN_IMAGE_MAX_BYTES / 1024 / 1024} MB. Export PDF drawings as an image first.</p>
        {problem?.field === 'file' && <p role="alert" className="mt-1 text-xs font-medium text-short-600">{problem.message}</p>}
      </div>
      <TextField label="Name" value={name} onChange={(e) => setName(e.target.value)} placeholder="Ground floor" error={problem?.field === 'name' ? problem.message : undefined} />
      <TextField label="Plan width (m)" inputMode="decimal" value={width} onChange={(e) => setWidth(e.target.value)} hint="Optional: you can also set the scale later by clicking two points." error={problem?.field === 'widthM' ? problem.message : undefined} />
      {progress !== null && <div className="sm:col-span-2"><ProgressBar value={progress} label="Uploading" /></div>}
      {problem && !problem.field && <div className="sm:col-span-2"><FormError error={new Error(problem.message)} /></div>}
      <div className="sm:col-span-2"><Button type="submit" busy={upload.isPending}><Upload className="h-4 w-4" aria-hidden />Upload plan</Button></div>
    </form>
  );
}
