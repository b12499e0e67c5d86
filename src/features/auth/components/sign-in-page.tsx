import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { useMe } from '../api/get-me';
import { signInSchema, useSignIn, type SignInInput } from '../api/sign-in';

/** Only same-site paths may be a return target. */
function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/spools';
}

export function SignInPage() {
  const [params] = useSearchParams();
  const next = safeNext(params.get('next'));
  const navigate = useNavigate();
  const me = useMe();
  const signIn = useSignIn();
  const form = useForm<SignInInput>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  if (me.data) return <Navigate to={next} replace />;

  const onSubmit = form.handleSubmit((values) => {
    signIn.mutate(values, { onSuccess: () => void navigate(next, { replace: true }) });
  });

  return (
    <main className="flex min-h-screen items-center justify-center bg-steel-100 font-sans">
      <div className="w-full max-w-sm rounded-lg border border-steel-200 bg-white p-6 shadow-sm">
        <div className="mb-5 flex items-center gap-2">
          <span aria-hidden className="inline-block h-4 w-4 rotate-45 border-2 border-copper-500" />
          <h1 className="text-xl font-semibold text-steel-800">Spoolwright</h1>
        </div>
        <p className="mb-4 text-sm text-steel-600">Sign in to your team's spools.</p>
        <form onSubmit={(e) => void onSubmit(e)} className="flex flex-col gap-3" noValidate>
          <TextField
            label="Email"
            type="email"
            autoComplete="username"
            {...form.register('email')}
            error={form.formState.errors.email?.message}
          />
          <TextField
            label="Password"
            type="password"
            autoComplete="current-password"
            {...form.register('password')}
            error={form.formState.errors.password?.message}
          />
          {signIn.isError ? (
            <p role="alert" className="text-sm text-red-700">
              {signIn.error.message || 'sign-in failed'}
            </p>
          ) : null}
          <Button type="submit" variant="primary" disabled={signIn.isPending}>
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </Button>
          <Link to="/forgot-password" className="text-sm text-copper-600 hover:underline">
            Forgot password?
          </Link>
        </form>
      </div>
    </main>
  );
}
