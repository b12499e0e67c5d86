import { useState } from 'react';
import { isRole, type Role } from '@shared/model/permissions';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { PageFrame, Panel, tableClass, tdClass, thClass } from '@/components/ui/page-frame';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { useMe } from '@/features/auth/api/get-me';
import { useCan } from '@/features/auth/use-can';
import { formatDateTime } from '@/lib/format';
import { cn } from '@/lib/cn';
import { useChangeRole } from '../api/change-role';
import { useInvitations } from '../api/get-invitations';
import { useMembers } from '../api/get-members';
import { useInviteMember } from '../api/invite-member';
import { useRemoveMember } from '../api/remove-member';
import type { Invitation, Member } from '../api/team-schemas';
import { useWithdrawInvitation } from '../api/withdraw-invitation';
import { InviteForm } from './invite-form';
import { ROLE_OPTIONS, roleLabel } from './role-labels';

/** Team members: who is in the team and their role; admins invite, re-role and remove. */
export function MembersPage() {
  const me = useMe();
  const members = useMembers();
  const manage = useCan('team:manage');
  const admins = (members.data ?? []).filter((m) => m.role === 'admin').length;

  return (
    <PageFrame
      title="Team members"
      intro={
        <>
          {me.data?.team?.name ?? 'Your team'} ·{' '}
          {members.data
            ? `${members.data.length} member${members.data.length === 1 ? '' : 's'}`
            : '…'}
          {manage ? ' · a team keeps at least one admin' : null}
        </>
      }
    >
      {manage ? (
        <Panel title="Invite a member">
          <p className="mb-3 text-sm text-steel-600">
            The person gets an e-mail with a link to choose their own password, then signs in with
            the role you pick.
          </p>
          <InviteForm />
        </Panel>
      ) : null}
      <Panel title="Members">
        {members.isPending ? (
          <LoadingLine />
        ) : members.isError ? (
          <ErrorLine error={members.error} />
        ) : null}
        {members.data ? (
          <table className={tableClass} data-testid="members">
            <thead>
              <tr>
                <th className={thClass}>Name</th>
                <th className={thClass}>E-mail</th>
                <th className={thClass}>Role</th>
                <th className={thClass}>Member since</th>
                {manage ? (
                  <th className={thClass}>
                    <span className="sr-only">Actions</span>
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody>
              {members.data.map((m) => (
                <MemberRow
                  key={m.userId}
                  member={m}
                  manage={manage}
                  isSelf={m.userId === me.data?.user.id}
                  soleAdmin={m.role === 'admin' && admins <= 1}
                />
              ))}
            </tbody>
          </table>
        ) : null}
      </Panel>
      {manage ? <InvitationsPanel /> : null}
    </PageFrame>
  );
}

function MemberRow({
  member,
  manage,
  isSelf,
  soleAdmin,
}: {
  readonly member: Member;
  readonly manage: boolean;
  readonly isSelf: boolean;
  readonly soleAdmin: boolean;
}) {
  const change = useChangeRole();
  const remove = useRemoveMember();
  const [confirming, setConfirming] = useState(false);
  const error = change.error ?? remove.error;
  const who = member.name || member.email;
  return (
    <tr data-member={member.email}>
      <td className={tdClass}>
        {who}
        {isSelf ? <span className="ml-1 text-xs text-steel-500">(you)</span> : null}
      </td>
      <td className={tdClass}>{member.email}</td>
      <td className={tdClass}>
        {manage ? (
          <select
            aria-label={`Role of ${who}`}
            className={cn(inputClass, 'w-36')}
            value={member.role}
            disabled={change.isPending}
            onChange={(e) => {
              remove.reset();
              const role = e.target.value;
              if (isRole(role)) change.mutate({ userId: member.userId, role: role as Role });
            }}
          >
            {ROLE_OPTIONS.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </select>
        ) : (
          roleLabel(member.role)
        )}
        {manage && soleAdmin ? (
          <p className="mt-0.5 text-xs text-steel-500">The team's only admin</p>
        ) : null}
        {error ? (
          <p role="alert" className="mt-1 max-w-md text-xs text-red-700">
            {error.message}
          </p>
        ) : null}
      </td>
      <td className={cn(tdClass, 'tabular-nums')}>
        {member.createdAt ? formatDateTime(member.createdAt) : '—'}
      </td>
      {manage ? (
        <td className={cn(tdClass, 'whitespace-nowrap text-right')}>
          {confirming ? (
            <span className="inline-flex items-center gap-2">
              <span className="text-xs text-steel-700">Remove {who} from the team?</span>
              <Button
                size="sm"
                variant="danger"
                disabled={remove.isPending}
                onClick={() => {
                  change.reset();
                  remove.mutate(member.userId, { onSettled: () => setConfirming(false) });
                }}
              >
                Confirm removal
              </Button>
              <Button size="sm" variant="ghost" onClick={() => setConfirming(false)}>
                Cancel
              </Button>
            </span>
          ) : (
            <Button
              size="sm"
              variant="danger"
              aria-label={`Remove ${who}`}
              onClick={() => setConfirming(true)}
            >
              Remove
            </Button>
          )}
        </td>
      ) : null}
    </tr>
  );
}

const stateLook: Record<Invitation['state'], string> = {
  pending: 'bg-sky-100 text-sky-800',
  accepted: 'bg-emerald-100 text-emerald-800',
  expired: 'bg-steel-100 text-steel-600',
  revoked: 'bg-steel-100 text-steel-600',
};
const stateLabel: Record<Invitation['state'], string> = {
  pending: 'Waiting',
  accepted: 'Accepted',
  expired: 'Expired',
  revoked: 'Withdrawn',
};

function InvitationsPanel() {
  const invitations = useInvitations();
  const withdraw = useWithdrawInvitation();
  const resend = useInviteMember();
  const error = withdraw.error ?? resend.error;
  return (
    <Panel title="Invitations">
      {invitations.isPending ? (
        <LoadingLine />
      ) : invitations.isError ? (
        <ErrorLine error={invitations.error} />
      ) : null}
      {error ? <ErrorLine error={error} /> : null}
      {invitations.data && invitations.data.length === 0 ? (
        <p className="text-sm text-steel-500">No invitations sent yet.</p>
      ) : null}
      {invitations.data && invitations.data.length > 0 ? (
        <table className={tableClass} data-testid="invitations">
          <thead>
            <tr>
              <th className={thClass}>Name</th>
              <th className={thClass}>E-mail</th>
              <th className={thClass}>Role</th>
              <th className={thClass}>State</th>
              <th className={thClass}>Sent</th>
              <th className={thClass}>Link valid until</th>
              <th className={thClass}>
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {invitations.data.map((inv) => (
              <tr key={inv.id} data-invitation={inv.email} data-state={inv.state}>
                <td className={tdClass}>{inv.name}</td>
                <td className={tdClass}>{inv.email}</td>
                <td className={tdClass}>{roleLabel(inv.role)}</td>
                <td className={tdClass}>
                  <span
                    className={cn('rounded px-1.5 py-px text-xs font-medium', stateLook[inv.state])}
                  >
                    {stateLabel[inv.state]}
                  </span>
                </td>
                <td className={cn(tdClass, 'tabular-nums')}>
                  {formatDateTime(inv.createdAt)}
                  {inv.invitedBy ? (
                    <span className="block text-xs text-steel-500">by {inv.invitedBy}</span>
                  ) : null}
                </td>
                <td className={cn(tdClass, 'tabular-nums')}>
                  {inv.state === 'accepted' ? '—' : formatDateTime(inv.expiresAt)}
                </td>
                <td className={cn(tdClass, 'whitespace-nowrap text-right')}>
                  {inv.state === 'pending' ? (
                    <Button
                      size="sm"
                      variant="ghost"
                      disabled={withdraw.isPending}
                      onClick={() => withdraw.mutate(inv.id)}
                    >
                      Withdraw
                    </Button>
                  ) : null}
                  {inv.state !== 'accepted' ? (
                    <Button
                      size="sm"
                      variant="ghost"
                      disabled={resend.isPending}
                      onClick={() =>
                        resend.mutate({
                          name: inv.name,
                          email: inv.email,
                          role: isRole(inv.role) ? inv.role : 'designer',
                        })
                      }
                    >
                      Send again
                    </Button>
                  ) : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
    </Panel>
  );
}
