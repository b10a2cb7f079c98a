import { useSyncExternalStore } from 'react';

/** Below this width (px) tables become stacked rows that lead with what matters (Tailwind's `sm`). */
export const NARROW_MAX_PX = 639;
const QUERY = `(max-width: ${NARROW_MAX_PX}px)`;

const subscribe = (onChange: () => void) => {
  if (typeof window === 'undefined' || !window.matchMedia) return () => {};
  const m = window.matchMedia(QUERY);
  m.addEventListener('change', onChange);
  return () => m.removeEventListener('change', onChange);
};
const snapshot = () => (typeof window !== 'undefined' && !!window.matchMedia && window.matchMedia(QUERY).matches);

/** True on a phone-width viewport; follows rotation and window resizes. */
export function useNarrow(): boolean {
  return useSyncExternalStore(subscribe, snapshot, () => false);
}
