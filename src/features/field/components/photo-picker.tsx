import { Camera } from 'lucide-react';

/** The phone's camera (or a picked image) as one big button, with the choice to keep the photo's location. */
export function PhotoPicker({ label, keepLocation, onKeepLocation, onFile }: {
  label: string;
  keepLocation: boolean;
  onKeepLocation: (keep: boolean) => void;
  onFile: (file: File) => void;
}) {
  return (
    <>
      <label className="flex min-h-11 cursor-pointer items-center gap-2 rounded-xl bg-ink-100 px-4 text-base font-semibold text-ink-950 focus-within:ring-4 focus-within:ring-lamp-500">
        <Camera className="h-5 w-5" aria-hidden />{label}
        <input type="file" accept="image/*" capture="environment" className="sr-only" onChange={(e) => { const f = e.target.files?.[0]; if (f) onFile(f); e.target.value = ''; }} />
      </label>
      <label className="flex min-h-11 items-center gap-2 text-sm text-ink-900">
        <input type="checkbox" className="h-5 w-5" checked={keepLocation} onChange={(e) => onKeepLocation(e.target.checked)} />Keep the photo's location
      </label>
    </>
  );
}
