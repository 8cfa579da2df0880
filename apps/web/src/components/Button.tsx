import type { ButtonHTMLAttributes, ReactNode } from 'react';
import { Link, type LinkProps } from 'react-router';
import { LoaderCircle } from 'lucide-react';
import { cx } from './cx';

export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';

const base =
  'inline-flex min-h-11 items-center justify-center gap-2 rounded-md px-4 py-2 text-base font-medium ' +
  'transition-colors disabled:cursor-not-allowed disabled:opacity-60 select-none';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-accent text-paper-raised hover:bg-accent-strong',
  secondary: 'border border-rule-strong bg-paper-raised text-ink hover:bg-paper-sunk',
  quiet: 'text-accent underline-offset-4 hover:underline hover:bg-accent-soft/60',
  danger: 'bg-danger text-paper-raised hover:bg-danger-strong',
};

export function buttonClasses(variant: ButtonVariant = 'primary', className?: string): string {
  return cx(base, variants[variant], className);
}

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  /** Shows a spinner, disables the button and replaces the label with `busyLabel` if given. */
  busy?: boolean;
  busyLabel?: ReactNode;
  icon?: ReactNode;
}

export function Button({
  variant = 'primary',
  busy = false,
  busyLabel,
  icon,
  className,
  children,
  disabled,
  type = 'button',
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClasses(variant, className)}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {busy ? <LoaderCircle aria-hidden className="size-4 animate-spin" /> : icon}
      {busy && busyLabel ? busyLabel : children}
    </button>
  );
}

interface ButtonLinkProps extends LinkProps {
  variant?: ButtonVariant;
  icon?: ReactNode;
}

/** A link that looks like a button, for actions that go somewhere. */
export function ButtonLink({ variant = 'primary', icon, className, children, ...rest }: ButtonLinkProps) {
  return (
    <Link className={buttonClasses(variant, typeof className === 'string' ? className : undefined)} {...rest}>
      {icon}
      {children}
    </Link>
  );
}
