export const controlClasses =
  'block w-full min-h-11 rounded-md border bg-paper-raised px-3 py-2 text-base text-ink ' +
  'placeholder:text-ink-faint disabled:opacity-60 aria-[invalid=true]:border-danger ' +
  'border-rule-strong focus-visible:border-accent';

export const labelClasses = 'block text-sm font-medium text-ink';
export const hintClasses = 'text-sm text-ink-muted';
