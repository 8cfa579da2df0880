import { queryOptions } from '@tanstack/react-query';
import type { LabelDto } from '@barmkeep/schemas';
import { api } from '../client';

export const labelKeys = {
  all: ['labels'] as const,
  lists: () => [...labelKeys.all, 'list'] as const,
  list: (ids: string[]) => [...labelKeys.lists(), ids] as const,
};

export const labelQueries = {
  list: (ids: string[]) =>
    queryOptions({
      queryKey: labelKeys.list(ids),
      queryFn: ({ signal }) =>
        api
          .get<{ labels: LabelDto[] }>(`/labels?ids=${ids.map(encodeURIComponent).join(',')}`, signal)
          .then((r) => r.labels),
      enabled: ids.length > 0,
    }),
};

export const labelPngUrl = (id: string, size: 'small' | 'large') =>
  `/api/labels/${encodeURIComponent(id)}/png?size=${size}`;
