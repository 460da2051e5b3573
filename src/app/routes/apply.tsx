import { useState } from 'react'
import { Link } from 'react-router-dom'
import type { ApplicationReceipt } from '@shared/schemas/shops'
import { Brand } from '@/components/layout/brand'
import { paths } from '@/config/paths'
import { ApplicationForm } from '@/features/shops/components/application-form'

/** The public wholesale application: a shop that is not a stockist yet applies here. */
export function Component() {
  const [receipt, setReceipt] = useState<ApplicationReceipt | null>(null)
  return (
    <div className="flex min-h-dvh flex-col items-center px-4 py-8 sm:py-12">
      <main className="w-full max-w-3xl">
        <div className="mb-6 flex items-center justify-between gap-4">
          <Link to={paths.signIn} className="rounded no-underline" aria-label="Lathercase sign-in">
            <Brand />
          </Link>
          <Link
            to={paths.signIn}
            className="text-sm font-medium text-olive-800 underline hover:text-olive-900"
          >
            Already a stockist? Sign in
          </Link>
        </div>
        <div className="rounded-card bg-white p-5 shadow-card sm:p-8">
          {receipt ? (
            <div role="status" className="flex flex-col gap-3">
              <h1 className="text-2xl font-medium tracking-tight text-ink-900">Thank you for applying</h1>
              <p className="text-ink-700">
                We received the application{receipt.tradingName ? ` for ${receipt.tradingName}` : ''} and your
                resale certificate. A confirmation is on its way to{' '}
                <span className="font-medium text-ink-900">{receipt.contactEmail}</span>.
              </p>
              <p className="text-ink-700">
                When we open your account, you will get an e-mail with a link to set your password and order
                by the case.
              </p>
              <p className="mt-2 text-sm">
                <Link to={paths.signIn} className="text-olive-800 underline hover:text-olive-900">
                  Back to sign-in
                </Link>
              </p>
            </div>
          ) : (
            <>
              <h1 className="text-2xl font-medium tracking-tight text-ink-900">
                Apply for a wholesale account
              </h1>
              <p className="mt-1 mb-6 max-w-prose text-ink-700">
                For shops that want to stock our soap. Tell us about your business and send your resale
                certificate; we read every application and answer by e-mail, usually within a few working
                days.
              </p>
              <ApplicationForm
                onSubmitted={(r) => {
                  setReceipt(r)
                  window.scrollTo({ top: 0 })
                }}
              />
            </>
          )}
        </div>
        <p className="mt-6 text-center text-xs text-ink-600">
          Wholesale orders for handmade soap, by the case.
        </p>
      </main>
    </div>
  )
}
