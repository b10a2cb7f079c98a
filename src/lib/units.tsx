import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';
import { luxToFootcandles } from '@shared/core/units';

export type IlluminanceUnit = 'lx' | 'fc';

type UnitsValue = {
  unit: IlluminanceUnit;
  setUnit: (u: IlluminanceUnit) => void;
  /** Converts lux to the chosen unit (the core works in lux; conversion happens here, at the edge). */
  convert: (lux: number) => number;
  /** Formats an illuminance with a sensible number of digits and the unit. */
  format: (lux: number | null | undefined, opts?: { withUnit?: boolean; bound?: 'exact' | 'lower' | 'upper' }) => string;
  label: string;
};

const UnitsContext = createContext<UnitsValue | null>(null);
const STORAGE_KEY = 'luxtrail.unit';

/** Three significant figures, never scientific notation for ordinary survey levels. */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return '–';
  // Decide the digits on the value rounded to 3 significant figures, so 9.99999 shows as 10.0.
  const abs = Math.abs(Number(value.toPrecision(3)));
  const digits = abs >= 100 ? 0 : abs >= 10 ? 1 : abs >= 1 ? 2 : 3;
  return value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

export function UnitsProvider({ children }: { children: ReactNode }) {
  const [unit, setUnitState] = useState<IlluminanceUnit>(() => (typeof localStorage !== 'undefined' && localStorage.getItem(STORAGE_KEY) === 'fc' ? 'fc' : 'lx'));
  const setUnit = useCallback((u: IlluminanceUnit) => {
    setUnitState(u);
    try { localStorage.setItem(STORAGE_KEY, u); } catch { /* private mode: the choice lasts this visit */ }
  }, []);
  const value = useMemo<UnitsValue>(() => {
    const convert = (lux: number) => (unit === 'fc' ? luxToFootcandles(lux) : lux);
    return {
      unit,
      setUnit,
      convert,
      label: unit === 'fc' ? 'fc' : 'lx',
      format: (lux, opts = {}) => {
        if (lux === null || lux === undefined) return '–';
        const prefix = opts.bound === 'lower' ? '≥ ' : opts.bound === 'upper' ? '≤ ' : '';
        return `${prefix}${formatNumber(convert(lux))}${opts.withUnit === false ? '' : ` ${unit === 'fc' ? 'fc' : 'lx'}`}`;
      },
    };
  }, [unit, setUnit]);
  return <UnitsContext.Provider value={value}>{children}</UnitsContext.Provider>;
}

export function useUnits(): UnitsValue {
  const ctx = useContext(UnitsContext);
  if (!ctx) throw new Error('useUnits must be used inside <UnitsProvider>');
  return ctx;
}
