import { useId, type InputHTMLAttributes, type ReactNode, type Ref } from 'react';
import { FieldError } from './FieldError';
import { hintClasses } from './fieldStyles';
import { cx } from './cx';

export interface RadioOption {
  value: string;
  label: ReactNode;
  /** A short example shown under the label, e.g. how a value will look. */
  example?: ReactNode;
}

interface RadioGroupProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'type' | 'id' | 'value'> {
  legend: ReactNode;
  options: readonly RadioOption[];
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLInputElement>;
}

/**
 * A set of radio buttons laid out as cards. Spread react-hook-form's
 * `register(name)` into it; every radio shares the same props.
 */
export function RadioGroup({ legend, options, hint, error, className, ref, ...inputProps }: RadioGroupProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ');

  return (
    <fieldset
      className={cx('space-y-2', className)}
      aria-describedby={describedBy || undefined}
      aria-invalid={error ? true : undefined}
    >
      <legend className="text-sm font-medium text-ink">{legend}</legend>
      {hint ? (
        <p id={hintId} className={hintClasses}>
          {hint}
        </p>
      ) : null}
      <div className="grid gap-2 sm:grid-cols-2">
        {options.map((option) => (
          <label
            key={option.value}
            className={cx(
              'flex min-h-11 cursor-pointer items-start gap-3 rounded-md border border-rule-strong bg-paper-raised px-3 py-2.5',
              'has-[:checked]:border-accent has-[:checked]:bg-accent-soft/50 has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-accent',
            )}
          >
            <input
              type="radio"
              value={option.value}
              ref={ref}
              className="mt-1 size-4 shrink-0 accent-accent focus-visible:outline-none"
              {...inputProps}
            />
            <span className="flex flex-col">
              <span className="font-medium">{option.label}</span>
              {option.example ? <span className="text-sm text-ink-muted">{option.example}</span> : null}
            </span>
          </label>
        ))}
      </div>
      <FieldError id={errorId} message={error} />
    </fieldset>
  );
}
