import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';
import { luxToFootcandles } from '@shared/core/units';
import { formatDisplayNumber } from '@shared/display-number';

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

/** The shared display rule (shared/display-number), re-exported for the client. */
export const formatNumber = formatDisplayNumber;

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
