import type { ReactNode } from 'react'
import { Brand } from '@/components/layout/brand'

/** The frame of the signed-out pages: the mark, one card, a line about the product. */
export function AuthLayout({
  title,
  intro,
  children,
}: {
  title: string
  intro?: ReactNode
  children: ReactNode
}) {
  return (
    <div className="flex min-h-dvh flex-col items-center justify-center px-4 py-10">
      <main className="w-full max-w-sm">
        <div className="mb-6 flex justify-center">
          <Brand />
        </div>
        <div className="rounded-card bg-white p-6 shadow-card">
          <h1 className="mb-1 text-xl font-bold text-ink-900">{title}</h1>
          {intro ? <p className="mb-5 text-sm text-ink-700">{intro}</p> : <div className="mb-4" />}
          {children}
        </div>
        <p className="mt-6 text-center text-xs text-ink-600">
          Wholesale orders for handmade soap, by the case.
        </p>
      </main>
    </div>
  )
}
