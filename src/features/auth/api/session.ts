import { useMutation, useQueryClient } from '@tanstack/react-query'
import type {
  LoginInput,
  PasswordResetRequestInput,
  SessionUser,
  SetPasswordInput,
} from '@shared/schemas/auth'
import { api, setCsrfToken } from '@/lib/api-client'
import { authKeys } from '@/features/auth/api/me'

export function useLogin() {
  const qc = useQueryClient()
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: LoginInput) =>
      api<{ user: SessionUser; csrfToken: string }>('/auth/login', {
        method: 'POST',
        body: input,
        allowUnauthorized: true,
      }),
    onSuccess: (data) => {
      setCsrfToken(data.csrfToken)
      qc.clear()
      qc.setQueryData(authKeys.me(), data.user)
    },
  })
}

export function useLogout() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: () => api<void>('/auth/logout', { method: 'POST' }),
    onSettled: () => {
      setCsrfToken(null)
      qc.clear()
      qc.setQueryData(authKeys.me(), null)
    },
  })
}

export function useRequestPasswordReset() {
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: PasswordResetRequestInput) =>
      api<void>('/auth/password-reset', { method: 'POST', body: input }),
  })
}

export type TokenInfo = { purpose: 'reset' | 'invite'; email: string; name: string }

export function fetchTokenInfo(token: string) {
  return api<TokenInfo>(`/auth/tokens/${encodeURIComponent(token)}`, { allowUnauthorized: true })
}

export function useSetPassword() {
  return useMutation({
    meta: { handlesError: true },
    mutationFn: (input: SetPasswordInput) => api<void>('/auth/set-password', { method: 'POST', body: input }),
  })
}
