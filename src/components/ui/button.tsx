import { forwardRef, type ButtonHTMLAttributes } from 'react';
import { cn } from '@/lib/cn';

type Variant = 'primary' | 'secondary' | 'ghost' | 'danger';
type Size = 'sm' | 'md';

const variants: Record<Variant, string> = {
  primary: 'bg-copper-500 text-white hover:bg-copper-600 disabled:bg-steel-300',
  secondary:
    'border border-steel-300 bg-white text-steel-800 hover:bg-steel-100 disabled:text-steel-400 disabled:hover:bg-white',
  ghost: 'text-steel-700 hover:bg-steel-100 disabled:text-steel-300 disabled:hover:bg-transparent',
  danger: 'border border-red-300 bg-white text-red-700 hover:bg-red-50 disabled:text-steel-400',
};
const sizes: Record<Size, string> = {
  sm: 'h-7 px-2 text-xs',
  md: 'h-9 px-3 text-sm',
};

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  readonly variant?: Variant;
  readonly size?: Size;
}

export const Button = forwardRef<HTMLButtonElement, ButtonProps>(function Button(
  { variant = 'secondary', size = 'md', className, type = 'button', ...rest },
  ref,
) {
  return (
    <button
      ref={ref}
      type={type}
      className={cn(
        'inline-flex items-center justify-center gap-1 rounded font-medium transition-colors focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-copper-500 disabled:cursor-not-allowed',
        variants[variant],
        sizes[size],
        className,
      )}
      {...rest}
    />
  );
});
