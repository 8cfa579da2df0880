import { useId, type ReactNode, type Ref, type TextareaHTMLAttributes } from 'react';
import { FieldError } from './FieldError';
import { controlClasses, hintClasses, labelClasses } from './fieldStyles';
import { cx } from './cx';

interface TextAreaProps extends Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'id'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLTextAreaElement>;
}

export function TextArea({ label, hint, error, className, ref, rows = 3, ...rest }: TextAreaProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ');
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
      <textarea
        id={id}
        ref={ref}
        rows={rows}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy || undefined}
        className={cx(controlClasses, 'resize-y')}
        {...rest}
      />
      <FieldError id={errorId} message={error} />
    </div>
  );
}
