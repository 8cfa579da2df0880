import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  ClubCreateInput,
  ClubDto,
  ClubInvitationCreateInput,
  ClubInvitationDto,
  ClubMemberDto,
  ClubMemberUpdateInput,
  ClubUpdateInput,
  ClubListingCreateInput,
  ClubStockCreateInput,
  ClubStockDto,
  ClubStockUpdateInput,
  ClubStockWithdrawInput,
  StrainRequestCreateInput,
  StrainRequestDto,
  StrainRequestReceiveInput,
  StrainRequestRespondInput,
} from '@barmkeep/schemas';
import { api } from '../client';
import { clubKeys } from './queries';
import { cultureKeys } from '../cultures/queries';

const clubPath = (clubId: string) => `/clubs/${encodeURIComponent(clubId)}`;

export function useCreateClubMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ClubCreateInput) => api.post<{ club: ClubDto }>('/clubs', input).then((r) => r.club),
    onSuccess: async (club) => {
      queryClient.setQueryData(clubKeys.detail(club.id), club);
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useUpdateClubMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ClubUpdateInput) => api.patch<{ club: ClubDto }>(clubPath(clubId), input).then((r) => r.club),
    onSuccess: async (club) => {
      queryClient.setQueryData(clubKeys.detail(clubId), club);
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useDeleteClubMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<void>(clubPath(clubId)),
    onSuccess: async () => {
      queryClient.removeQueries({ queryKey: clubKeys.detail(clubId) });
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useLeaveClubMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<void>(`${clubPath(clubId)}/leave`),
    onSuccess: async () => {
      queryClient.removeQueries({ queryKey: clubKeys.detail(clubId) });
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useChangeMemberRoleMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, ...input }: ClubMemberUpdateInput & { userId: string }) =>
      api
        .patch<{ member: ClubMemberDto }>(`${clubPath(clubId)}/members/${encodeURIComponent(userId)}`, input)
        .then((r) => r.member),
    // the actor's own role may have changed too: refresh the whole club
    onSettled: () => queryClient.invalidateQueries({ queryKey: clubKeys.detail(clubId) }),
  });
}

export function useRemoveMemberMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => api.delete<void>(`${clubPath(clubId)}/members/${encodeURIComponent(userId)}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clubKeys.detail(clubId) }),
  });
}

export function useInviteMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ClubInvitationCreateInput) =>
      api.post<{ invitation: ClubInvitationDto }>(`${clubPath(clubId)}/invitations`, input).then((r) => r.invitation),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clubKeys.invitations(clubId) }),
  });
}

export function useRevokeInvitationMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) =>
      api.delete<{ invitation: ClubInvitationDto }>(
        `${clubPath(clubId)}/invitations/${encodeURIComponent(invitationId)}`,
      ),
    onSettled: () => queryClient.invalidateQueries({ queryKey: clubKeys.invitations(clubId) }),
  });
}

/* The bank, requests and club stock: each change refreshes the club's bank, requests, stock and feed. */

function useClubChange<I, O>(clubId: string, fn: (input: I) => Promise<O>, alsoCultures = false) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: clubKeys.bank(clubId) }),
        queryClient.invalidateQueries({ queryKey: clubKeys.requests(clubId) }),
        queryClient.invalidateQueries({ queryKey: clubKeys.stock(clubId) }),
        queryClient.invalidateQueries({ queryKey: clubKeys.activity(clubId) }),
        alsoCultures ? queryClient.invalidateQueries({ queryKey: cultureKeys.all }) : null,
      ]);
    },
  });
}

export function useListCultureMutation(clubId: string) {
  return useClubChange(clubId, (input: ClubListingCreateInput) =>
    api.post<{ listing: { id: string; cultureId: string } }>(`${clubPath(clubId)}/bank`, input).then((r) => r.listing),
  );
}

export function useWithdrawListingMutation(clubId: string) {
  return useClubChange(clubId, (listingId: string) =>
    api.delete<void>(`${clubPath(clubId)}/bank/${encodeURIComponent(listingId)}`),
  );
}

export function useCreateRequestMutation(clubId: string) {
  return useClubChange(clubId, (input: StrainRequestCreateInput) =>
    api.post<{ request: { id: string; status: string } }>(`${clubPath(clubId)}/requests`, input).then((r) => r.request),
  );
}

export function useRespondMutation(clubId: string) {
  return useClubChange(clubId, ({ requestId, ...input }: StrainRequestRespondInput & { requestId: string }) =>
    api
      .post<{ request: StrainRequestDto }>(
        `${clubPath(clubId)}/requests/${encodeURIComponent(requestId)}/respond`,
        input,
      )
      .then((r) => r.request),
  );
}

/** The person who asked takes the request back. */
export function useCancelRequestMutation(clubId: string) {
  return useClubChange(clubId, (requestId: string) =>
    api
      .post<{ request: { id: string; status: string } }>(
        `${clubPath(clubId)}/requests/${encodeURIComponent(requestId)}/cancel`,
      )
      .then((r) => r.request),
  );
}

export function useReceiveMutation(clubId: string) {
  return useClubChange(
    clubId,
    ({ requestId, ...input }: StrainRequestReceiveInput & { requestId: string }) =>
      api.post<{ request: StrainRequestDto; cultureId: string }>(
        `${clubPath(clubId)}/requests/${encodeURIComponent(requestId)}/receive`,
        input,
      ),
    true,
  );
}

export function useAddStockMutation(clubId: string) {
  return useClubChange(
    clubId,
    (input: ClubStockCreateInput) =>
      api.post<{ stock: ClubStockDto }>(`${clubPath(clubId)}/stock`, input).then((r) => r.stock),
    true,
  );
}

export function useUpdateStockMutation(clubId: string) {
  return useClubChange(clubId, ({ cultureId, ...input }: ClubStockUpdateInput & { cultureId: string }) =>
    api
      .patch<{ stock: ClubStockDto }>(`${clubPath(clubId)}/stock/${encodeURIComponent(cultureId)}`, input)
      .then((r) => r.stock),
  );
}

export function useWithdrawStockMutation(clubId: string) {
  return useClubChange(
    clubId,
    ({ cultureId, ...input }: ClubStockWithdrawInput & { cultureId: string }) =>
      api.post<{ cultureId: string; stock: ClubStockDto }>(
        `${clubPath(clubId)}/stock/${encodeURIComponent(cultureId)}/withdraw`,
        input,
      ),
    true,
  );
}
