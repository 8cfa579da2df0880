import type { HTMLAttributes } from 'react';
import { cx } from './cx';

/** A sheet of paper on the page: the container for a form or a record. */
export function Card({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return (
    <div
      className={cx(
        'rounded-lg border border-rule bg-paper-raised p-5 shadow-[0_1px_0_var(--color-rule)] sm:p-6',
        className,
      )}
      {...rest}
    />
  );
}
