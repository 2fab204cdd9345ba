import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';
const styles: Record<Variant, string> = {
  primary: 'bg-action text-white hover:bg-action-strong',
  secondary: 'border border-rule-strong bg-sheet text-ink hover:bg-paper',
  danger: 'bg-danger text-white hover:opacity-90',
  quiet: 'text-action hover:underline',
};

export function Button({
  variant = 'primary',
  className = '',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      className={`inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium disabled:opacity-50 disabled:cursor-not-allowed ${styles[variant]} ${className}`}
      {...props}
    />
  );
}
