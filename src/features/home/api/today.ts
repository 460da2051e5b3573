import { useQuery } from '@tanstack/react-query'
import type { TodayDto } from '@shared/schemas/home'
import { api } from '@/lib/api-client'

export const homeKeys = { all: ['home'] as const, today: () => ['home', 'today'] as const }

export const useToday = () =>
  useQuery({
    queryKey: homeKeys.today(),
    queryFn: async () => (await api<{ today: TodayDto }>('/home/today')).today,
    refetchOnMount: 'always',
  })
