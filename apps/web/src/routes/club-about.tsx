import { useState } from 'react';
import { useNavigate } from 'react-router';
import { LogOut } from 'lucide-react';
import { CLUB_ROLES } from '@barmkeep/schemas';
import { useLeaveClubMutation } from '../api/clubs/mutations';
import { Button, Card, Notice } from '../components';
import { RoleBadge, roleDescriptions } from '../components/clubs/RoleBadge';
import { useClub } from './club';

function LeaveClub() {
  const club = useClub();
  const navigate = useNavigate();
  const leave = useLeaveClubMutation(club.id);
  const [confirming, setConfirming] = useState(false);
  if (!club.myRole) return null;

  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-semibold">Leave the club</h2>
      <p className="text-ink-muted">
        Your own cultures stay yours. Strains you listed in the club’s bank are no longer offered to the others.
      </p>
      {leave.isError ? (
        <Notice tone="danger" live="assertive" title="You are still a member">
          {leave.error.message}
        </Notice>
      ) : null}
      {confirming ? (
        <div className="flex flex-wrap gap-2">
          <Button
            variant="danger"
            busy={leave.isPending}
            busyLabel="Leaving…"
            onClick={() => leave.mutate(undefined, { onSuccess: () => void navigate('/clubs', { replace: true }) })}
          >
            Yes, leave {club.name}
          </Button>
          <Button variant="secondary" onClick={() => setConfirming(false)}>
            Stay
          </Button>
        </div>
      ) : (
        <Button
          variant="secondary"
          icon={<LogOut aria-hidden className="size-4" />}
          onClick={() => setConfirming(true)}
        >
          Leave the club…
        </Button>
      )}
    </Card>
  );
}

export function Component() {
  const club = useClub();
  return (
    <div className="space-y-6">
      <Card className="space-y-3">
        {club.description ? (
          <p className="whitespace-pre-line">{club.description}</p>
        ) : (
          <p className="text-ink-muted">No description yet.</p>
        )}
        <p className="text-sm text-ink-muted">
          <span className="num">{club.memberCount}</span> {club.memberCount === 1 ? 'member' : 'members'} · requests{' '}
          {club.requestsNeedApproval ? 'are approved by a steward first' : 'go straight to the keeper'}
        </p>
      </Card>
      <Card>
        <h2 className="mb-3 text-lg font-semibold">Who does what</h2>
        <dl className="space-y-3">
          {CLUB_ROLES.map((role) => (
            <div key={role} className="grid gap-1 sm:grid-cols-[7rem_1fr]">
              <dt>
                <RoleBadge role={role} />
              </dt>
              <dd className="text-ink-muted">{roleDescriptions[role]}</dd>
            </div>
          ))}
        </dl>
      </Card>
      <LeaveClub />
    </div>
  );
}
