import { queryOptions } from '@tanstack/react-query';
import type {
  BatchDto,
  CultureDetailDto,
  CultureSummaryDto,
  EquipmentDto,
  GenerationPointDto,
  PlanDto,
  PlanSummaryDto,
} from '@barmkeep/schemas';
import { api } from '../client';

export const planKeys = {
  all: ['plans'] as const,
  lists: () => [...planKeys.all, 'list'] as const,
  list: () => [...planKeys.lists(), {}] as const,
  details: () => [...planKeys.all, 'detail'] as const,
  detail: (id: string) => [...planKeys.details(), id] as const,
};

export const equipmentKeys = {
  all: ['equipment'] as const,
  detail: () => [...equipmentKeys.all, 'mine'] as const,
};

export const batchKeys = {
  all: ['batches'] as const,
  lists: () => [...batchKeys.all, 'list'] as const,
  list: () => [...batchKeys.lists(), {}] as const,
  details: () => [...batchKeys.all, 'detail'] as const,
  detail: (id: string) => [...batchKeys.details(), id] as const,
  generations: (scope: { cultureId?: string; strain?: string }) => [...batchKeys.all, 'generations', scope] as const,
};

/** The culture library's keys start with 'cultures', so invalidating that prefix refreshes its pages too. */
export const plannerCultureKeys = {
  usable: () => ['cultures', 'list', { planner: true }] as const,
  detail: (id: string) => ['cultures', 'detail', id] as const,
};

export const planningQueries = {
  equipment: () =>
    queryOptions({
      queryKey: equipmentKeys.detail(),
      queryFn: ({ signal }) =>
        api.get<{ equipment: EquipmentDto }>('/account/equipment', signal).then((r) => r.equipment),
    }),
  plans: () =>
    queryOptions({
      queryKey: planKeys.list(),
      queryFn: ({ signal }) => api.get<{ plans: PlanSummaryDto[] }>('/plans', signal).then((r) => r.plans),
    }),
  plan: (id: string) =>
    queryOptions({
      queryKey: planKeys.detail(id),
      queryFn: ({ signal }) =>
        api.get<{ plan: PlanDto }>(`/plans/${encodeURIComponent(id)}`, signal).then((r) => r.plan),
    }),
  usableCultures: () =>
    queryOptions({
      queryKey: plannerCultureKeys.usable(),
      queryFn: ({ signal }) =>
        api
          .get<{ cultures: CultureSummaryDto[] }>('/cultures?state=active,stored&sort=name&pageSize=100', signal)
          .then((r) => r.cultures),
    }),
  culture: (id: string) =>
    queryOptions({
      queryKey: plannerCultureKeys.detail(id),
      queryFn: ({ signal }) =>
        api.get<{ culture: CultureDetailDto }>(`/cultures/${encodeURIComponent(id)}`, signal).then((r) => r.culture),
    }),
  batches: () =>
    queryOptions({
      queryKey: batchKeys.list(),
      queryFn: ({ signal }) => api.get<{ batches: BatchDto[] }>('/batches', signal).then((r) => r.batches),
    }),
  batch: (id: string) =>
    queryOptions({
      queryKey: batchKeys.detail(id),
      queryFn: ({ signal }) =>
        api.get<{ batch: BatchDto }>(`/batches/${encodeURIComponent(id)}`, signal).then((r) => r.batch),
    }),
  generations: (scope: { cultureId?: string; strain?: string }) =>
    queryOptions({
      queryKey: batchKeys.generations(scope),
      queryFn: ({ signal }) => {
        const q = new URLSearchParams();
        if (scope.cultureId) q.set('cultureId', scope.cultureId);
        if (scope.strain) q.set('strain', scope.strain);
        return api.get<{ points: GenerationPointDto[]; scope: { kind: 'lineage' | 'strain'; label: string } }>(
          `/batches/generations?${q.toString()}`,
          signal,
        );
      },
    }),
};
