import { useQueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { AuthCard } from '@/features/auth/components/auth-card';
import { NewPasswordForm } from '@/features/auth/components/new-password-fields';
import { signIn } from '@/features/auth/api/sign-in';
import { formatDateTime } from '@/lib/format';
import { useAcceptInvitation } from '../api/accept-invitation';
import { useInvitationDetails } from '../api/lookup-invitation';
import { roleLabel } from './role-labels';

/** `/accept-invite?token=…` (outside sign-in): choose a password, join the team, sign in. */
export function AcceptInvitePage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const details = useInvitationDetails(token);
  const accept = useAcceptInvitation();
  const qc = useQueryClient();
  const navigate = useNavigate();

  if (!token) {
    return (
      <AuthCard intro="This invitation link is incomplete. Open the whole link from the e-mail.">
        <Link to="/sign-in" className="text-sm text-copper-600 hover:underline">
          Go to sign-in
        </Link>
      </AuthCard>
    );
  }
  if (details.isPending)
    return (
      <AuthCard intro="Reading the invitation…">
        <LoadingLine />
      </AuthCard>
    );
  if (details.isError) {
    return (
      <AuthCard intro="This invitation cannot be used.">
        <ErrorLine error={details.error} />
        <Link to="/sign-in" className="mt-3 block text-sm text-copper-600 hover:underline">
          Go to sign-in
        </Link>
      </AuthCard>
    );
  }
  const inv = details.data;
  const onSubmit = (password: string) => {
    accept.mutate(
      { token, password },
      {
        onSuccess: (out) => {
          // Whatever was cached belonged to whoever used this browser before.
          qc.clear();
          void signIn({ email: out.email, password }).then(
            () => navigate('/spools', { replace: true }),
            () => navigate(`/sign-in?next=${encodeURIComponent('/spools')}`),
          );
        },
      },
    );
  };
  return (
    <AuthCard
      intro={
        <>
          <p className="text-base text-steel-800">
            Welcome, {inv.name}. You are invited to <strong>{inv.team.name}</strong> as{' '}
            <strong data-testid="invited-role">{roleLabel(inv.role)}</strong>.
          </p>
          <p className="mt-1">
            Choose the password for <strong>{inv.email}</strong>. The link works once, until{' '}
            {formatDateTime(inv.expiresAt)}.
          </p>
        </>
      }
    >
      <NewPasswordForm
        submitLabel="Join the team and sign in"
        pending={accept.isPending}
        error={accept.isError ? accept.error.message : null}
        onSubmit={onSubmit}
        username={inv.email}
      />
    </AuthCard>
  );
}
