import { Link } from 'react-router-dom'
import { AuthLayout } from '@/components/layout/auth-layout'
import { paths } from '@/config/paths'
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form'

export function Component() {
  return (
    <AuthLayout
      title="Reset your password"
      intro="Enter the e-mail address you sign in with; we will send you a link."
    >
      <ForgotPasswordForm />
      <p className="mt-4 text-center text-sm">
        <Link to={paths.signIn} className="text-olive-800 underline">
          Back to sign in
        </Link>
      </p>
    </AuthLayout>
  )
}
