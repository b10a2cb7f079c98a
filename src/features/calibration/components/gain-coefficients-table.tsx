import type { GainCoefficientsInput } from '@shared/schemas/coefficient-sets';
import { useUnits } from '@/lib/units';
import { percent, sig } from './format';

/** Per gain code: dark counts, responsivity (in the chosen unit per count) and uncertainty. */
export function GainCoefficientsTable({ gains, caption }: { gains: GainCoefficientsInput[]; caption: string }) {
  const { convert, label } = useUnits();
  return (
    <div className="scroll-x">
      <table className="min-w-full text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="text-left text-xs uppercase tracking-wide text-ink-500">
          <tr><th scope="col" className="py-1 pr-4">Gain code</th><th scope="col" className="py-1 pr-4">Dark (counts)</th><th scope="col" className="py-1 pr-4">{label} per count</th><th scope="col" className="py-1 pr-4">u<sub>rel</sub> (k = 1)</th></tr>
        </thead>
        <tbody className="num">
          {gains.map((g) => (
            <tr key={g.code} className="border-t border-ink-100">
              <td className="py-1 pr-4">{g.code}</td>
              <td className="py-1 pr-4">{sig(g.darkCounts, 4)}{g.uDarkCounts !== undefined ? ` ± ${sig(g.uDarkCounts, 2)}` : ''}</td>
              <td className="py-1 pr-4">{sig(convert(g.luxPerCount), 5)}</td>
              <td className="py-1 pr-4">{percent(g.uRel)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
