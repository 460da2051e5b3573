import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { Settings } from '@shared/schemas/settings'
import type {
  CreatePlannedPourInput,
  PlannedPour,
  PlanningSettingsInput,
  PlanQueryInput,
  PourPlan,
} from '@shared/schemas/planning'
import { api, qs } from '@/lib/api-client'

export const planningKeys = {
  all: ['planning'] as const,
  plans: () => [...planningKeys.all, 'plan'] as const,
  plan: (q: PlanQueryInput) => [...planningKeys.plans(), q] as const,
  pour: (id: number) => [...planningKeys.all, 'pour', id] as const,
}

export const usePourPlan = (q: PlanQueryInput) =>
  useQuery({
    queryKey: planningKeys.plan(q),
    queryFn: async () =>
      (
        await api<{ plan: PourPlan }>(
          `/planning/plan${qs({ windowWeeks: q.windowWeeks, coverWeeks: q.coverWeeks, horizonWeeks: q.horizonWeeks })}`,
        )
      ).plan,
    placeholderData: keepPreviousData,
    // Stock and orders move all day; the plan is read fresh each time the screen opens.
    refetchOnMount: 'always',
  })

export const usePlannedPour = (id: number | null) =>
  useQuery({
    queryKey: planningKeys.pour(id ?? 0),
    queryFn: async () => (await api<{ plannedPour: PlannedPour }>(`/planning/pours/${id}`)).plannedPour,
    enabled: id !== null,
    // The batch form says itself that a plan was not found and starts without it.
    meta: { handlesError: true },
  })

export function useCreatePlannedPour() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: CreatePlannedPourInput) =>
      api<{ plannedPour: PlannedPour }>('/planning/pours', { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: planningKeys.all }),
  })
}

export function useDropPlannedPour() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (id: number) =>
      api<{ plannedPour: PlannedPour }>(`/planning/pours/${id}`, { method: 'DELETE' }),
    onSuccess: () => qc.invalidateQueries({ queryKey: planningKeys.all }),
  })
}

export function useSavePlanningSettings() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: PlanningSettingsInput) =>
      api<{ settings: Settings }>('/settings/planning', { method: 'PUT', body: input }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: ['studio'] })
      void qc.invalidateQueries({ queryKey: planningKeys.all })
    },
  })
}
