import { Link, useSearchParams } from 'react-router-dom';
import { isApiError } from '@/lib/api';
import { useResetPassword } from '../api/reset-password';
import { AuthCard } from './auth-card';
import { NewPasswordForm } from './new-password-fields';

function resetError(e: unknown): string {
  if (isApiError(e) && /token/i.test(`${e.code} ${e.message}`))
    return 'This reset link is not valid any more (it works once, within an hour). Ask for a new one.';
  return e instanceof Error ? e.message : 'The password could not be changed';
}

/** `/reset-password?token=…`: the page the reset mail links to. */
export function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const reset = useResetPassword();
  if (!token || params.get('error')) {
    return (
      <AuthCard intro="This reset link is incomplete or no longer valid.">
        <Link to="/forgot-password" className="text-sm text-copper-600 hover:underline">
          Ask for a new link
        </Link>
      </AuthCard>
    );
  }
  if (reset.isSuccess) {
    return (
      <AuthCard intro="Your password has been changed. Other sessions of your account were signed out.">
        <Link to="/sign-in" className="text-sm font-medium text-copper-600 hover:underline">
          Sign in with the new password
        </Link>
      </AuthCard>
    );
  }
  return (
    <AuthCard intro="Choose a new password for your account.">
      <NewPasswordForm
        submitLabel="Set the new password"
        pending={reset.isPending}
        error={reset.isError ? resetError(reset.error) : null}
        onSubmit={(password) => reset.mutate({ token, newPassword: password })}
      />
      {reset.isError ? (
        <Link to="/forgot-password" className="mt-3 block text-sm text-copper-600 hover:underline">
          Ask for a new link
        </Link>
      ) : null}
    </AuthCard>
  );
}
