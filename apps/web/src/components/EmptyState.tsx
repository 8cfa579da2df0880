import type { ReactNode } from 'react';
import { cx } from './cx';

interface EmptyStateProps {
  icon?: ReactNode;
  title: ReactNode;
  children?: ReactNode;
  /** The one thing to do next. */
  action?: ReactNode;
  className?: string;
}

export function EmptyState({ icon, title, children, action, className }: EmptyStateProps) {
  return (
    <section
      className={cx(
        'flex flex-col items-center gap-4 rounded-lg border border-dashed border-rule-strong bg-paper-raised/70 px-5 py-10 text-center',
        className,
      )}
    >
      {icon ? <div className="text-accent">{icon}</div> : null}
      <h2 className="text-lg font-semibold">{title}</h2>
      {children ? <div className="max-w-prose text-ink-muted">{children}</div> : null}
      {action ? <div className="pt-1">{action}</div> : null}
    </section>
  );
}
