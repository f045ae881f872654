import type { ButtonHTMLAttributes } from 'react';

const VARIANTS = {
  primary: 'bg-ink text-sheet border-ink hover:bg-ink-soft hover:border-ink-soft disabled:bg-ink-faint disabled:border-ink-faint',
  secondary: 'bg-sheet text-ink border-rule-strong hover:bg-shade disabled:text-ink-faint',
  quiet: 'bg-transparent text-ink-soft border-transparent hover:text-ink hover:bg-shade disabled:text-ink-faint',
} as const;

const SIZES = {
  sm: 'h-8 px-3 text-small gap-1.5',
  md: 'h-10 px-4 text-body gap-2',
} as const;

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: keyof typeof VARIANTS;
  size?: keyof typeof SIZES;
  /** Shows a working indicator, disables the button and tells assistive tech it is busy. */
  isBusy?: boolean;
}

export function Button({
  variant = 'primary',
  size = 'md',
  isBusy = false,
  disabled,
  className = '',
  children,
  type = 'button',
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || isBusy}
      aria-busy={isBusy || undefined}
      className={`inline-flex items-center justify-center rounded-sheet border font-medium transition-colors disabled:cursor-not-allowed ${VARIANTS[variant]} ${SIZES[size]} ${className}`}
      {...rest}
    >
      {isBusy ? <BusyDots /> : null}
      {children}
    </button>
  );
}

function BusyDots() {
  return (
    <span aria-hidden="true" className="inline-flex gap-0.5">
      <span className="size-1 animate-pulse rounded-full bg-current" />
      <span className="size-1 animate-pulse rounded-full bg-current [animation-delay:150ms]" />
      <span className="size-1 animate-pulse rounded-full bg-current [animation-delay:300ms]" />
    </span>
  );
}
