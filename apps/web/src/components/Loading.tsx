import { LoaderCircle } from 'lucide-react';

/** A loading status: a spinner and words. */
export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="flex items-center gap-2 py-6 text-ink-muted">
      <LoaderCircle aria-hidden className="size-5 animate-spin" />
      {label}
    </p>
  );
}
