import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  BatchCreateInput,
  BatchDto,
  BatchHarvestInput,
  BatchUpdateInput,
  EquipmentDto,
  EquipmentUpdateInput,
  PlanCreateInput,
  PlanDto,
  PlanStepCompleteInput,
} from '@barmkeep/schemas';
import { api, apiFetch } from '../client';
import { batchKeys, equipmentKeys, planKeys } from './queries';

export function useSaveEquipmentMutation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: EquipmentUpdateInput) =>
      apiFetch<{ equipment: EquipmentDto }>('/account/equipment', { method: 'PUT', body: input }).then(
        (r) => r.equipment,
      ),
    onSuccess: (equipment) => {
      qc.setQueryData(equipmentKeys.detail(), equipment);
    },
  });
}

export function useCreatePlanMutation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: PlanCreateInput) => api.post<{ plan: PlanDto }>('/plans', input).then((r) => r.plan),
    onSuccess: async (plan) => {
      qc.setQueryData(planKeys.detail(plan.id), plan);
      await qc.invalidateQueries({ queryKey: planKeys.lists() });
    },
  });
}

function usePlanAction<V>(fn: (v: V) => Promise<PlanDto>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async (plan) => {
      qc.setQueryData(planKeys.detail(plan.id), plan);
      await qc.invalidateQueries({ queryKey: planKeys.lists() });
      await qc.invalidateQueries({ queryKey: equipmentKeys.all });
    },
  });
}

export function useStartStepMutation(planId: string) {
  return usePlanAction(() =>
    api.post<{ plan: PlanDto }>(`/plans/${encodeURIComponent(planId)}/steps`).then((r) => r.plan),
  );
}

/** Call a plan off ('cancelled': its reminders stop) or take a called-off plan up again ('planned'). */
export function useSetPlanStatusMutation(planId: string) {
  return usePlanAction((status: 'planned' | 'cancelled') =>
    api.post<{ plan: PlanDto }>(`/plans/${encodeURIComponent(planId)}/status`, { status }).then((r) => r.plan),
  );
}

export function useCompleteStepMutation(planId: string) {
  return usePlanAction((v: { stepId: string; input: PlanStepCompleteInput }) =>
    api
      .post<{ plan: PlanDto }>(
        `/plans/${encodeURIComponent(planId)}/steps/${encodeURIComponent(v.stepId)}/complete`,
        v.input,
      )
      .then((r) => r.plan),
  );
}

export function useCreateBatchMutation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: BatchCreateInput) => api.post<{ batch: BatchDto }>('/batches', input).then((r) => r.batch),
    onSuccess: async (batch) => {
      qc.setQueryData(batchKeys.detail(batch.id), batch);
      await Promise.all([
        qc.invalidateQueries({ queryKey: batchKeys.all }),
        qc.invalidateQueries({ queryKey: planKeys.all }),
        qc.invalidateQueries({ queryKey: ['cultures'] }),
      ]);
    },
  });
}

export function useUpdateBatchMutation(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: BatchUpdateInput) =>
      api.patch<{ batch: BatchDto }>(`/batches/${encodeURIComponent(id)}`, input).then((r) => r.batch),
    onSuccess: async (batch) => {
      qc.setQueryData(batchKeys.detail(batch.id), batch);
      await qc.invalidateQueries({ queryKey: batchKeys.all });
    },
  });
}

export function useHarvestMutation(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: BatchHarvestInput) =>
      api.post<{ culture: { id: string; generation: number; strainName: string }; batch: BatchDto }>(
        `/batches/${encodeURIComponent(id)}/harvest`,
        input,
      ),
    onSuccess: async ({ batch }) => {
      qc.setQueryData(batchKeys.detail(batch.id), batch);
      await Promise.all([
        qc.invalidateQueries({ queryKey: batchKeys.all }),
        qc.invalidateQueries({ queryKey: ['cultures'] }),
      ]);
    },
  });
}
