import type { ImportProblem, ImportWarning } from '@shared/schemas/imports';

/** A rejected file's problems, each with the line and column to fix. */
export function ImportErrorsTable({ errors, filename }: { errors: ImportProblem[]; filename: string }) {
  return (
    <div className="scroll-x rounded-lg ring-1 ring-short-100">
      <table className="min-w-full text-sm" aria-label={`Problems in ${filename}`}>
        <caption className="bg-short-50 px-3 py-2 text-left text-sm font-medium text-short-700">
          {filename} was not imported: nothing from it was stored. Fix these lines and upload it again.
        </caption>
        <thead className="bg-ink-50 text-left text-xs uppercase tracking-wide text-ink-500">
          <tr><th scope="col" className="px-3 py-2">Line</th><th scope="col" className="px-3 py-2">Column</th><th scope="col" className="px-3 py-2">Value</th><th scope="col" className="px-3 py-2">Problem</th></tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {errors.map((e, i) => (
            <tr key={i}>
              <td className="num px-3 py-1.5">{e.line === 0 ? 'file' : e.line}</td>
              <td className="px-3 py-1.5 font-mono text-xs">{e.column || '–'}</td>
              <td className="max-w-[12rem] truncate px-3 py-1.5 font-mono text-xs" title={e.value}>{e.value || '–'}</td>
              <td className="px-3 py-1.5">{e.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function ImportWarningsList({ warnings }: { warnings: ImportWarning[] }) {
  if (warnings.length === 0) return null;
  return (
    <ul className="list-disc space-y-1 pl-5 text-sm text-lamp-800" aria-label="Import warnings">
      {warnings.map((w, i) => <li key={i}>{w.line ? `Line ${w.line}: ` : ''}{w.message}</li>)}
    </ul>
  );
}
