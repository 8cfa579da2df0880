import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  ApiErrorBody,
  CultureCreateInput,
  CultureDetailDto,
  CultureEventCreateInput,
  CultureEventDto,
  CulturePhotoDto,
  CultureQuarantineInput,
  CultureSplitInput,
  CultureStateChangeInput,
  CultureSummaryDto,
  CultureUpdateInput,
} from '@barmkeep/schemas';
import { api, ApiError } from '../client';
import { cultureKeys } from './queries';

const path = (id: string) => `/cultures/${encodeURIComponent(id)}`;

/** Anything that changes a culture can change the library order and its lineage: refresh both. */
function useInvalidateCulture() {
  const queryClient = useQueryClient();
  return async (id?: string) => {
    await Promise.all([
      queryClient.invalidateQueries({ queryKey: cultureKeys.lists() }),
      id ? queryClient.invalidateQueries({ queryKey: cultureKeys.detail(id) }) : Promise.resolve(),
    ]);
  };
}

export function useCreateCultureMutation() {
  const queryClient = useQueryClient();
  const invalidate = useInvalidateCulture();
  return useMutation({
    mutationFn: (input: CultureCreateInput) =>
      api.post<{ culture: CultureDetailDto }>('/cultures', input).then((r) => r.culture),
    onSuccess: async (culture) => {
      queryClient.setQueryData(cultureKeys.detail(culture.id), culture);
      await invalidate(culture.parentId ?? undefined);
    },
  });
}

export function useUpdateCultureMutation(id: string) {
  const queryClient = useQueryClient();
  const invalidate = useInvalidateCulture();
  return useMutation({
    mutationFn: (input: CultureUpdateInput) =>
      api.patch<{ culture: CultureDetailDto }>(path(id), input).then((r) => r.culture),
    onSuccess: async (culture, input) => {
      queryClient.setQueryData(cultureKeys.detail(id), culture);
      // a new parent moves a whole subtree: other cultures' generations and lineages change too
      if (input.parentId !== undefined) await queryClient.invalidateQueries({ queryKey: cultureKeys.all });
      else await invalidate(id);
    },
  });
}

export function useAddEventMutation(id: string) {
  const invalidate = useInvalidateCulture();
  return useMutation({
    mutationFn: (input: CultureEventCreateInput) =>
      api.post<{ event: CultureEventDto }>(`${path(id)}/events`, input).then((r) => r.event),
    onSuccess: () => invalidate(id),
  });
}

export function useChangeStateMutation(id: string) {
  const invalidate = useInvalidateCulture();
  return useMutation({
    mutationFn: (input: CultureStateChangeInput) =>
      api.post<{ culture: CultureDetailDto }>(`${path(id)}/state`, input).then((r) => r.culture),
    onSuccess: () => invalidate(id),
  });
}

export function useSplitMutation(id: string) {
  const invalidate = useInvalidateCulture();
  return useMutation({
    mutationFn: (input: CultureSplitInput) =>
      api.post<{ cultures: CultureSummaryDto[] }>(`${path(id)}/split`, input).then((r) => r.cultures),
    onSuccess: () => invalidate(id),
  });
}

export function useQuarantineMutation(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CultureQuarantineInput) =>
      api.post<{ flagged: number; eventId: string }>(`${path(id)}/quarantine`, input),
    // every flagged descendant changed too
    onSuccess: () => queryClient.invalidateQueries({ queryKey: cultureKeys.all }),
  });
}

/** Multipart upload; the bytes are checked on the server, whatever the file is called. */
export function useUploadPhotoMutation(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: { file: File; caption: string; eventId?: string }) => {
      const form = new FormData();
      form.set('caption', input.caption);
      if (input.eventId) form.set('eventId', input.eventId);
      form.set('photo', input.file);
      let res: Response;
      try {
        res = await fetch(`/api${path(id)}/photos`, {
          method: 'POST',
          body: form,
          credentials: 'same-origin',
          headers: { Accept: 'application/json' },
        });
      } catch {
        throw new ApiError({
          status: 0,
          code: 'network_error',
          message: 'Could not reach Barmkeep. Check your connection and try again.',
        });
      }
      const body = (await res.json().catch(() => undefined)) as
        ({ photo: CulturePhotoDto } & Partial<ApiErrorBody>) | undefined;
      if (!res.ok || !body?.photo) {
        throw new ApiError({
          status: res.status,
          code: body?.error?.code ?? 'bad_response',
          message: body?.error?.message ?? (res.status === 413 ? 'This photo is too large.' : 'The upload failed.'),
          fields: body?.error?.fields,
        });
      }
      return body.photo;
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: cultureKeys.photos(id) }),
  });
}

export function useDeletePhotoMutation(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (photoId: string) => api.delete<void>(`${path(id)}/photos/${encodeURIComponent(photoId)}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: cultureKeys.photos(id) }),
  });
}

/** Import a JSON backup: all or nothing; a bad file comes back with one message per wrong row. */
export function useImportBackupMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (file: File) => {
      const form = new FormData();
      form.set('file', file);
      let res: Response;
      try {
        res = await fetch('/api/cultures/backup', {
          method: 'POST',
          body: form,
          credentials: 'same-origin',
          headers: { Accept: 'application/json' },
        });
      } catch {
        throw new ApiError({
          status: 0,
          code: 'network_error',
          message: 'Could not reach Barmkeep. Check your connection and try again.',
        });
      }
      const body = (await res.json().catch(() => undefined)) as
        ({ imported: { cultures: number; events: number; photos: number } } & Partial<ApiErrorBody>) | undefined;
      if (!res.ok || !body?.imported) {
        throw new ApiError({
          status: res.status,
          code: body?.error?.code ?? 'bad_response',
          message: body?.error?.message ?? 'The import failed.',
          fields: body?.error?.fields,
        });
      }
      return body.imported;
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: cultureKeys.all }),
  });
}
