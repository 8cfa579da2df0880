import { useMemo, useState } from 'react';
import { useNavigate } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { CLUB_ROLES, type ClubDto, type ClubMemberDto, type ClubRoleName } from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { clubQueries } from '../api/clubs/queries';
import { useChangeMemberRoleMutation, useLeaveClubMutation, useRemoveMemberMutation } from '../api/clubs/mutations';
import { Button, Loading, Notice } from '../components';
import { controlClasses } from '../components/fieldStyles';
import { RoleBadge, roleLabels } from '../components/clubs/RoleBadge';
import { useClub } from './club';

const column = createColumnHelper<ClubMemberDto>();
const dateOnly = (iso: string) => new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' }).format(new Date(iso));

function RoleCell({ member, club, onError }: { member: ClubMemberDto; club: ClubDto; onError: (m: string) => void }) {
  const change = useChangeMemberRoleMutation(club.id);
  if (club.myRole !== 'owner') return <RoleBadge role={member.role} />;
  return (
    <select
      aria-label={`Role of ${member.name}`}
      className={`${controlClasses} min-h-10 w-auto py-1`}
      value={member.role}
      disabled={change.isPending}
      onChange={(e) =>
        change.mutate(
          { userId: member.userId, role: e.target.value as ClubRoleName },
          { onError: (error) => onError(error.message) },
        )
      }
    >
      {CLUB_ROLES.map((r) => (
        <option key={r} value={r}>
          {roleLabels[r]}
        </option>
      ))}
    </select>
  );
}

function ActionCell({
  member,
  club,
  myId,
  onError,
}: {
  member: ClubMemberDto;
  club: ClubDto;
  myId: string;
  onError: (m: string) => void;
}) {
  const navigate = useNavigate();
  const remove = useRemoveMemberMutation(club.id);
  const leave = useLeaveClubMutation(club.id);
  const [confirming, setConfirming] = useState(false);
  const isMe = member.userId === myId;
  if (!isMe && club.myRole !== 'owner') return null;

  const go = () => {
    if (isMe) {
      leave.mutate(undefined, {
        onSuccess: () => void navigate('/clubs', { replace: true }),
        onError: (error) => {
          setConfirming(false);
          onError(error.message);
        },
      });
    } else {
      remove.mutate(member.userId, {
        onError: (error) => {
          setConfirming(false);
          onError(error.message);
        },
      });
    }
  };
  if (!confirming) {
    return (
      <Button variant="quiet" className="min-h-10 px-2 text-sm" onClick={() => setConfirming(true)}>
        {isMe ? 'Leave' : 'Remove'}
      </Button>
    );
  }
  return (
    <span className="inline-flex flex-wrap gap-1">
      <Button
        variant="danger"
        className="min-h-10 px-2 text-sm"
        busy={remove.isPending || leave.isPending}
        onClick={go}
      >
        {isMe ? 'Yes, leave' : `Remove ${member.name.split(/\s+/)[0]}`}
      </Button>
      <Button variant="secondary" className="min-h-10 px-2 text-sm" onClick={() => setConfirming(false)}>
        Cancel
      </Button>
    </span>
  );
}

/** Columns left out on narrow screens (the e-mail moves under the name). */
const narrowHidden: Record<string, string> = { email: 'hidden md:table-cell', joinedAt: 'hidden sm:table-cell' };

export function Component() {
  const club = useClub();
  const { data: me } = useQuery(authQueries.me());
  const members = useQuery(clubQueries.members(club.id));
  const [problem, setProblem] = useState<string | null>(null);
  const showEmail = Boolean(members.data?.some((m) => m.email !== null));

  const columns = useMemo(
    () => [
      column.accessor('name', {
        header: 'Name',
        cell: (info) => (
          <>
            <span className="font-medium">
              {info.getValue()}
              {info.row.original.userId === me?.id ? <span className="ml-1 text-sm text-ink-muted">(you)</span> : null}
            </span>
            {/* on a narrow screen the e-mail goes under the name instead of a column of its own */}
            {info.row.original.email ? (
              <span className="block text-sm break-all text-ink-muted md:hidden">{info.row.original.email}</span>
            ) : null}
          </>
        ),
      }),
      column.accessor('role', {
        header: 'Role',
        cell: (info) => <RoleCell member={info.row.original} club={club} onError={setProblem} />,
      }),
      ...(showEmail
        ? [
            column.accessor('email', {
              header: 'E-mail',
              cell: (info) => <span className="break-all">{info.getValue()}</span>,
            }),
          ]
        : []),
      column.accessor('joinedAt', {
        header: 'Joined',
        cell: (info) => (
          <time className="num whitespace-nowrap" dateTime={info.getValue()}>
            {dateOnly(info.getValue())}
          </time>
        ),
      }),
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (info) => <ActionCell member={info.row.original} club={club} myId={me?.id ?? ''} onError={setProblem} />,
      }),
    ],
    [club, me?.id, showEmail],
  );

  const table = useReactTable({
    data: members.data ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    getRowId: (row) => row.userId,
  });

  if (members.isPending) return <Loading />;
  if (members.isError)
    return (
      <Notice tone="danger" title="Could not load the members">
        {members.error.message}
      </Notice>
    );

  return (
    <section aria-labelledby="members-heading" className="space-y-4">
      <h2 id="members-heading" className="text-lg font-semibold">
        Members <span className="num text-ink-muted">({members.data.length})</span>
      </h2>
      {club.myRole === 'owner' ? (
        <p className="text-sm text-ink-muted">
          To hand the club over, make someone else an owner; a club always keeps at least one.
        </p>
      ) : null}
      {problem ? (
        <Notice tone="danger" live="assertive" title="That did not work">
          {problem}
        </Notice>
      ) : null}
      <div className="overflow-x-auto rounded-lg border border-rule bg-paper-raised">
        <table className="w-full text-left">
          <thead className="border-b border-rule bg-paper-sunk/60 text-sm text-ink-muted">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => (
                  <th
                    key={header.id}
                    scope="col"
                    className={`px-3 py-2 font-medium ${narrowHidden[header.column.id] ?? ''}`}
                  >
                    {flexRender(header.column.columnDef.header, header.getContext())}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-b border-rule last:border-0">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={`px-3 py-2 align-middle ${narrowHidden[cell.column.id] ?? ''}`}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
