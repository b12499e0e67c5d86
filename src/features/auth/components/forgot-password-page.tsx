import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link, useSearchParams } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import {
  forgotPasswordSchema,
  useRequestPasswordReset,
  type ForgotPasswordInput,
} from '../api/request-password-reset';
import { AuthCard } from './auth-card';

/** "Forgot password": mails a link to the set-new-password page. */
export function ForgotPasswordPage() {
  const [params] = useSearchParams();
  const request = useRequestPasswordReset();
  const form = useForm<ForgotPasswordInput>({
    resolver: zodResolver(forgotPasswordSchema),
    defaultValues: { email: params.get('email') ?? '' },
  });
  const submit = form.handleSubmit((v) => request.mutate(v));
  return (
    <AuthCard intro="Give the e-mail address you sign in with. We send a link to choose a new password; it works once, within an hour.">
      {request.isSuccess ? (
        <div role="status" className="flex flex-col gap-3 text-sm text-steel-700">
          <p>
            If <strong>{form.getValues('email')}</strong> has an account, a link is on its way. Open
            it from your mailbox to choose a new password.
          </p>
          <Link to="/sign-in" className="text-copper-600 hover:underline">
            Back to sign-in
          </Link>
        </div>
      ) : (
        <form onSubmit={(e) => void submit(e)} noValidate className="flex flex-col gap-3">
          <TextField
            label="Email"
            type="email"
            autoComplete="username"
            {...form.register('email')}
            error={form.formState.errors.email?.message}
          />
          {request.isError ? (
            <p role="alert" className="text-sm text-red-700">
              {request.error.message}
            </p>
          ) : null}
          <Button type="submit" variant="primary" disabled={request.isPending}>
            {request.isPending ? 'Sending…' : 'Send the reset link'}
          </Button>
          <Link to="/sign-in" className="text-sm text-copper-600 hover:underline">
            Back to sign-in
          </Link>
        </form>
      )}
    </AuthCard>
  );
}
