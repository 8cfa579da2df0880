/**
 * The Barmkeep mark: a culture jar, its liquid topped by a band of foam with
 * two bubbles rising through it, drawn on a 32-unit grid.
 */
export function Mark({ className, title }: { className?: string; title?: string }) {
  return (
    <svg
      viewBox="0 0 32 32"
      className={className}
      role={title ? 'img' : undefined}
      aria-hidden={title ? undefined : true}
      aria-label={title}
      fill="none"
      stroke="currentColor"
      strokeWidth={2}
      strokeLinecap="round"
      strokeLinejoin="round"
    >
      {/* liquid under a band of foam */}
      <path
        d="M7 17.5c1.6-1.3 3.2-1.3 4.8 0s3.2 1.3 4.8 0 3.2-1.3 4.8 0 2.4 1 3.6.4V24a4 4 0 0 1-4 4H10a4 4 0 0 1-4-4z"
        fill="currentColor"
        fillOpacity={0.22}
        stroke="none"
      />
      {/* lid */}
      <path d="M11 4.5h10" />
      {/* jar */}
      <path d="M12 4.5v3.2c-3.6 1.3-6 4.6-6 8.6V24a4 4 0 0 0 4 4h12a4 4 0 0 0 4-4v-7.7c0-4-2.4-7.3-6-8.6V4.5" />
      {/* foam line */}
      <path d="M7 17.5c1.6-1.3 3.2-1.3 4.8 0s3.2 1.3 4.8 0 3.2-1.3 4.8 0 2.4 1 3.6.4" />
      {/* bubbles rising through the liquid */}
      <circle cx="12.5" cy="23.5" r="1.4" strokeWidth={1.5} />
      <circle cx="18" cy="21.5" r="0.9" strokeWidth={1.5} />
    </svg>
  );
}
