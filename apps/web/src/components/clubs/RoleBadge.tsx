import type { ClubRoleName } from '@barmkeep/schemas';
import { cx } from '../cx';

export const roleLabels: Record<ClubRoleName, string> = { owner: 'Owner', steward: 'Steward', member: 'Member' };

export const roleDescriptions: Record<ClubRoleName, string> = {
  owner: 'Changes the club’s settings and roles, invites stewards and owners, can delete the club.',
  steward:
    'Looks after the club bank and its frozen and slant stock, invites members, approves requests when the club asks for it.',
  member: 'Lists their own cultures in the bank, asks for strains and passes them on.',
};

const tone: Record<ClubRoleName, string> = {
  owner: 'border-accent bg-accent-soft text-accent-strong',
  steward: 'border-warn-line bg-warn-soft text-warn',
  member: 'border-rule-strong bg-paper-sunk text-ink-muted',
};

/** A role as a word in a pill (never colour alone). */
export function RoleBadge({ role, className }: { role: ClubRoleName; className?: string }) {
  return (
    <span
      className={cx(
        'inline-flex items-center rounded-full border px-2 py-0.5 text-xs font-semibold',
        tone[role],
        className,
      )}
    >
      {roleLabels[role]}
    </span>
  );
}
