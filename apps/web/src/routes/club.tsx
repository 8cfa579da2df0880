import { Link, NavLink, Outlet, useOutletContext, useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { ArrowLeft } from 'lucide-react';
import type { ClubDto } from '@barmkeep/schemas';
import { clubQueries } from '../api/clubs/queries';
import { isApiError } from '../api/client';
import { Loading, Notice, cx } from '../components';
import { RoleBadge } from '../components/clubs/RoleBadge';

export interface ClubOutletContext {
  club: ClubDto;
}

/** For the pages inside a club. */
export function useClub(): ClubDto {
  return useOutletContext<ClubOutletContext>().club;
}

export const canSteward = (club: ClubDto) => club.myRole === 'owner' || club.myRole === 'steward';

function ClubTabs({ club }: { club: ClubDto }) {
  const tabs = [
    { to: '', label: 'About', end: true, show: true },
    { to: 'bank', label: 'Bank', end: false, show: true },
    { to: 'stock', label: 'Stock', end: false, show: true },
    { to: 'requests', label: 'Requests', end: false, show: true },
    { to: 'activity', label: 'Activity', end: false, show: true },
    { to: 'members', label: 'Members', end: false, show: true },
    { to: 'invitations', label: 'Invitations', end: false, show: canSteward(club) },
    { to: 'settings', label: 'Settings', end: false, show: club.myRole === 'owner' },
  ].filter((t) => t.show);
  return (
    <nav aria-label="Club" className="-mx-1 mb-6 overflow-x-auto">
      <ul className="flex gap-1 border-b border-rule px-1">
        {tabs.map((tab) => (
          <li key={tab.label}>
            <NavLink
              to={tab.to}
              end={tab.end}
              className={({ isActive }) =>
                cx(
                  '-mb-px inline-flex min-h-11 items-center border-b-2 px-3 font-medium whitespace-nowrap',
                  isActive ? 'border-accent text-accent-strong' : 'border-transparent text-ink-muted hover:text-ink',
                )
              }
            >
              {tab.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}

export function Component() {
  const { clubId = '' } = useParams();
  const club = useQuery(clubQueries.detail(clubId));

  if (club.isPending) return <Loading />;
  if (club.isError) {
    const missing = isApiError(club.error) && (club.error.status === 404 || club.error.status === 400);
    return (
      <>
        <title>Club not found · Barmkeep</title>
        <Notice tone={missing ? 'warning' : 'danger'} title={missing ? 'No such club' : 'Could not load the club'}>
          <p>
            {missing
              ? 'Either this club does not exist, or you are not one of its members. Ask an owner or steward for an invitation.'
              : club.error.message}
          </p>
          <p className="mt-2">
            <Link to="/clubs" className="text-accent underline underline-offset-4">
              Back to your clubs
            </Link>
          </p>
        </Notice>
      </>
    );
  }

  const data = club.data;
  return (
    <>
      <title>{`${data.name} · Barmkeep`}</title>
      <p className="mb-3">
        <Link
          to="/clubs"
          className="inline-flex items-center gap-1 text-sm text-accent underline-offset-4 hover:underline"
        >
          <ArrowLeft aria-hidden className="size-4" /> All clubs
        </Link>
      </p>
      <div className="mb-4 flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold tracking-tight">{data.name}</h1>
        {data.myRole ? (
          <RoleBadge role={data.myRole} />
        ) : (
          <span className="text-sm text-ink-muted">Viewing as site admin</span>
        )}
      </div>
      <ClubTabs club={data} />
      <Outlet context={{ club: data } satisfies ClubOutletContext} />
    </>
  );
}
