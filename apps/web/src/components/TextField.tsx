import { useId, useState, type InputHTMLAttributes, type ReactNode, type Ref } from 'react';
import { Eye, EyeOff } from 'lucide-react';
import { FieldError } from './FieldError';
import { controlClasses, hintClasses, labelClasses } from './fieldStyles';
import { cx } from './cx';

interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLInputElement>;
  /** For type="password": adds a button that shows or hides what was typed. */
  revealable?: boolean;
}

export function TextField({
  label,
  hint,
  error,
  className,
  type = 'text',
  revealable = false,
  ref,
  ...rest
}: TextFieldProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const [revealed, setRevealed] = useState(false);
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ');
  const canReveal = revealable && type === 'password';

  return (
    <div className={cx('space-y-1.5', className)}>
      <label htmlFor={id} className={labelClasses}>
        {label}
      </label>
      {hint ? (
        <p id={hintId} className={hintClasses}>
          {hint}
        </p>
      ) : null}
      <div className="relative">
        <input
          id={id}
          ref={ref}
          type={canReveal && revealed ? 'text' : type}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy || undefined}
          className={cx(controlClasses, canReveal && 'pr-20')}
          {...rest}
        />
        {canReveal ? (
          <button
            type="button"
            onClick={() => setRevealed((value) => !value)}
            aria-pressed={revealed}
            aria-controls={id}
            className="absolute inset-y-1 right-1 inline-flex items-center gap-1 rounded px-2 text-sm text-accent hover:bg-accent-soft"
          >
            {revealed ? <EyeOff aria-hidden className="size-4" /> : <Eye aria-hidden className="size-4" />}
            {revealed ? 'Hide' : 'Show'}
          </button>
        ) : null}
      </div>
      <FieldError id={errorId} message={error} />
    </div>
  );
}
