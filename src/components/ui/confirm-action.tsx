import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { Button, type ButtonProps } from './button';

type Props = {
  /** The first button, which only asks. */
  trigger: ReactNode;
  /** What will happen, said before anything happens (it cannot be undone). */
  consequence: ReactNode;
  /** The button that acts. */
  confirmLabel: ReactNode;
  onConfirm: () => void;
  busy?: boolean;
  disabled?: boolean;
  title?: string;
  variant?: ButtonProps['variant'];
  size?: ButtonProps['size'];
  'aria-label'?: string;
};

/**
 * An action that cannot be undone takes two steps: the first click says what will happen and
 * offers the confirming button and a way back; nothing is sent until the second.
 */
export function ConfirmAction({ trigger, consequence, confirmLabel, onConfirm, busy, disabled, title, variant = 'primary', size = 'sm', ...rest }: Props) {
  const [asking, setAsking] = useState(false);
  const id = useId();
  const confirmRef = useRef<HTMLButtonElement>(null);
  useEffect(() => { if (asking) confirmRef.current?.focus(); }, [asking]);
  if (!asking) {
    return <Button variant={variant} size={size} disabled={disabled} title={title} aria-label={rest['aria-label']} onClick={() => setAsking(true)}>{trigger}</Button>;
  }
  return (
    <div role="group" aria-labelledby={id} className="flex max-w-md flex-col gap-2 rounded-lg bg-lamp-50 p-3 text-sm ring-1 ring-lamp-200">
      <p id={id} className="text-ink-800">{consequence}</p>
      <div className="flex flex-wrap gap-2">
        <Button ref={confirmRef} variant={variant} size={size} busy={busy} onClick={() => { onConfirm(); setAsking(false); }}>{confirmLabel}</Button>
        <Button variant="ghost" size={size} onClick={() => setAsking(false)}>Cancel</Button>
      </div>
    </div>
  );
}
