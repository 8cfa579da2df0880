import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type {
  CultureDetailDto,
  CultureEventDto,
  CultureListDto,
  CulturePhotoDto,
  LineageNodeDto,
  CultureState,
} from '@barmkeep/schemas';
import { api } from '../client';

/** Filters of the library as they appear in the URL and in the query key. */
export interface CultureListFilters {
  q?: string;
  state?: string;
  form?: string;
  sort?: string;
  dir?: 'asc' | 'desc';
  page?: number;
  pageSize?: number;
  maxAgeDays?: number;
  viabilityMaxPct?: number;
}

export interface HealthSeries {
  now: string;
  series: { at: string; viability: number; outOfRange: boolean }[];
  measured: { at: string; viability: number; ci95: [number, number] | null }[];
}

export interface QuarantineCandidate {
  id: string;
  parentId: string;
  depth: number;
  strainName: string;
  generation: number;
  state: CultureState;
  suspect: boolean;
}

const path = (id: string) => `/cultures/${encodeURIComponent(id)}`;

export const cultureKeys = {
  all: ['cultures'] as const,
  lists: () => [...cultureKeys.all, 'list'] as const,
  list: (filters: CultureListFilters) => [...cultureKeys.lists(), filters] as const,
  details: () => [...cultureKeys.all, 'detail'] as const,
  detail: (id: string) => [...cultureKeys.details(), id] as const,
  events: (id: string) => [...cultureKeys.detail(id), 'events'] as const,
  health: (id: string, days: number) => [...cultureKeys.detail(id), 'health', days] as const,
  photos: (id: string) => [...cultureKeys.detail(id), 'photos'] as const,
  lineage: (id: string) => [...cultureKeys.detail(id), 'lineage'] as const,
  quarantine: (id: string) => [...cultureKeys.detail(id), 'quarantine-preview'] as const,
};

function searchOf(filters: CultureListFilters): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== '') params.set(k, String(v));
  const s = params.toString();
  return s ? `?${s}` : '';
}

export const cultureQueries = {
  list: (filters: CultureListFilters) =>
    queryOptions({
      queryKey: cultureKeys.list(filters),
      queryFn: ({ signal }) => api.get<CultureListDto>(`/cultures${searchOf(filters)}`, signal),
      placeholderData: keepPreviousData,
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: cultureKeys.detail(id),
      queryFn: ({ signal }) => api.get<{ culture: CultureDetailDto }>(path(id), signal).then((r) => r.culture),
    }),
  events: (id: string) =>
    queryOptions({
      queryKey: cultureKeys.events(id),
      queryFn: ({ signal }) =>
        api.get<{ events: CultureEventDto[] }>(`${path(id)}/events`, signal).then((r) => r.events),
    }),
  health: (id: string, days = 56) =>
    queryOptions({
      queryKey: cultureKeys.health(id, days),
      queryFn: ({ signal }) => api.get<HealthSeries>(`${path(id)}/health?days=${days}`, signal),
    }),
  photos: (id: string) =>
    queryOptions({
      queryKey: cultureKeys.photos(id),
      queryFn: ({ signal }) =>
        api.get<{ photos: CulturePhotoDto[] }>(`${path(id)}/photos`, signal).then((r) => r.photos),
    }),
  lineage: (id: string) =>
    queryOptions({
      queryKey: cultureKeys.lineage(id),
      queryFn: ({ signal }) =>
        api.get<{ focusId: string; rootId: string; nodes: LineageNodeDto[] }>(`${path(id)}/lineage`, signal),
    }),
  quarantinePreview: (id: string) =>
    queryOptions({
      queryKey: cultureKeys.quarantine(id),
      queryFn: ({ signal }) =>
        api
          .get<{ descendants: QuarantineCandidate[] }>(`${path(id)}/quarantine-preview`, signal)
          .then((r) => r.descendants),
    }),
};
