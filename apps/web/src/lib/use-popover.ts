import { useEffect, useId, useRef, useState } from 'react';

/**
 * Open/close state for a button and the panel it opens: a click outside closes it, Escape closes it and puts
 * focus back on the button. Put `rootRef` on the element holding both.
 */
export function usePopover() {
  const [open, setOpen] = useState(false);
  const rootRef = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const panelId = useId();

  useEffect(() => {
    if (!open) return;
    const onPointer = (event: PointerEvent) => {
      if (!rootRef.current?.contains(event.target as Node)) setOpen(false);
    };
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') {
        setOpen(false);
        buttonRef.current?.focus();
      }
    };
    document.addEventListener('pointerdown', onPointer);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('pointerdown', onPointer);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);

  /** Spread on the button that opens the panel. */
  const buttonProps = { ref: buttonRef, type: 'button', 'aria-expanded': open, 'aria-controls': panelId, onClick: () => setOpen((value) => !value) } as const;

  return { open, setOpen, rootRef, buttonRef, buttonProps, panelId };
}
