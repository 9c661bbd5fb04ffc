import type { ButtonHTMLAttributes } from 'react';

const STYLES = {
  primary: 'bg-tide-700 text-white hover:bg-tide-900 disabled:opacity-50',
  secondary: 'border border-tide-700 text-tide-700 bg-white hover:bg-tide-50 disabled:opacity-50',
  danger: 'bg-alarm-600 text-white hover:opacity-90 disabled:opacity-50',
} as const;

export function Button({ variant = 'primary', className = '', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: keyof typeof STYLES }) {
  return <button type="button" className={`rounded-md px-4 py-2 text-sm font-semibold ${STYLES[variant]} ${className}`} {...props} />;
}
