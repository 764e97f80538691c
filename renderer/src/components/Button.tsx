import type { ComponentProps, MouseEvent } from 'react';

export type ButtonVariant = 'primary' | 'secondary' | 'ghost' | 'danger';

export interface ButtonProps extends ComponentProps<'button'> {
  variant?: ButtonVariant;
  size?: 'sm' | 'md';
  /** Shows the button as working and ignores clicks until the action settles. */
  busy?: boolean;
}

/** A busy button's clicks, a form's Enter included (it clicks the submit button), do nothing. */
function ignoreClick(event: MouseEvent<HTMLButtonElement>): void {
  event.preventDefault();
}

export function Button({ variant = 'secondary', size = 'md', busy = false, className, type = 'button', disabled, onClick, children, ...rest }: ButtonProps) {
  const classes = ['btn', `btn--${variant}`, `btn--${size}`, busy ? 'btn--busy' : '', className ?? ''].filter(Boolean).join(' ');
  // A busy button stays focusable, marked aria-disabled with its clicks ignored: the native
  // `disabled` on the button just pressed would send the keyboard's place back to the start
  // of the page while the action runs, and leave it there.
  return (
    <button
      {...rest}
      type={type}
      className={classes}
      disabled={busy ? undefined : disabled}
      aria-disabled={busy || undefined}
      aria-busy={busy || undefined}
      onClick={busy ? ignoreClick : onClick}
    >
      {children}
    </button>
  );
}
