import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';

const variants: Record<Variant, string> = {
  primary: 'bg-board text-white hover:bg-teal-900',
  secondary: 'border border-stone-400 bg-white text-ink hover:bg-stone-50',
  danger: 'bg-high text-white hover:bg-red-900',
  ghost: 'text-ink hover:bg-stone-200',
};

/** A button with a 44 px touch target. */
export function Button({ variant = 'primary', className = '', ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type="button"
      className={`inline-flex min-h-11 items-center justify-center gap-2 rounded-md px-4 font-semibold disabled:cursor-not-allowed disabled:opacity-60 ${variants[variant]} ${className}`}
      {...rest}
    />
  );
}
