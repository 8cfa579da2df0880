import type { ReactNode } from 'react';
import { CircleCheck, Info, OctagonExclamationPoint, TriangleExclamationPoint, type LucideIcon } from 'lucide-react';
import { cx } from './cx';

export type NoticeTone = 'info' | 'success' | 'warning' | 'danger';

const tones: Record<NoticeTone, { word: string; Icon: LucideIcon; classes: string }> = {
  info: { word: 'Note', Icon: Info, classes: 'border-rule-strong bg-paper-raised text-ink' },
  success: { word: 'Done', Icon: CircleCheck, classes: 'border-accent bg-accent-soft/60 text-accent-strong' },
  warning: { word: 'Heads up', Icon: TriangleExclamationPoint, classes: 'border-warn-line bg-warn-soft text-warn' },
  danger: { word: 'Problem', Icon: OctagonExclamationPoint, classes: 'border-danger bg-danger-soft text-danger' },
};

interface NoticeProps {
  tone?: NoticeTone;
  /** Overrides the status word shown before the message. */
  word?: string;
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
  /**
   * Announce to screen readers when it appears: "assertive" for errors that
   * block the person, "polite" for confirmations.
   */
  live?: 'assertive' | 'polite';
}

/** A status message: always an icon and a word, never colour alone. */
export function Notice({ tone = 'info', word, title, children, className, live }: NoticeProps) {
  const { word: defaultWord, Icon, classes } = tones[tone];
  const role = live === 'assertive' ? 'alert' : live === 'polite' ? 'status' : undefined;
  return (
    <div role={role} className={cx('flex gap-3 rounded-md border-l-4 border px-4 py-3', classes, className)}>
      <Icon aria-hidden className="mt-0.5 size-5 shrink-0" />
      <div className="min-w-0 space-y-1">
        <p className="font-semibold">
          {word ?? defaultWord}
          {title ? <span className="font-semibold">: {title}</span> : null}
        </p>
        {children ? <div className="text-ink">{children}</div> : null}
      </div>
    </div>
  );
}

/** The form-level error slot: renders nothing when there is no message. */
export function FormAlert({ message, children }: { message?: string; children?: ReactNode }) {
  if (!message) return null;
  return (
    <Notice tone="danger" live="assertive" title={message}>
      {children}
    </Notice>
  );
}
