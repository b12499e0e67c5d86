import { useState } from 'react';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { INVITATION_DAYS, inviteMemberSchema, type InviteMemberInput } from '@shared/model/team';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { applyServerErrors } from '@/lib/form-errors';
import { useInviteMember } from '../api/invite-member';
import { ROLE_OPTIONS } from './role-labels';

const FIELDS = ['name', 'email', 'role'] as const;

/** Name, e-mail and role of a new member; the server mails them a one-use link. */
export function InviteForm() {
  const invite = useInviteMember();
  const [sent, setSent] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<InviteMemberInput>({
    resolver: zodResolver(inviteMemberSchema),
    defaultValues: { name: '', email: '', role: 'designer' },
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) => {
    setSent(null);
    setFormError(null);
    invite.mutate(values, {
      onSuccess: (inv) => {
        setSent(
          `Invitation sent to ${inv.email}. The link works once, for ${INVITATION_DAYS} days.`,
        );
        form.reset({ name: '', email: '', role: values.role });
      },
      onError: (e) => {
        const rest = applyServerErrors(e, form.setError, FIELDS);
        if (rest.length > 0) setFormError(rest.join('; '));
      },
    });
  });

  return (
    <form
      aria-label="Invite a member"
      onSubmit={(e) => void onSubmit(e)}
      noValidate
      className="grid grid-cols-[1fr_1fr_10rem_auto] items-start gap-3"
    >
      <TextField
        label="Name"
        autoComplete="off"
        {...form.register('name')}
        error={errors.name?.message && `Name ${errors.name.message}`}
      />
      <TextField
        label="E-mail"
        type="email"
        autoComplete="off"
        {...form.register('email')}
        error={errors.email?.message && `E-mail ${errors.email.message}`}
      />
      <SelectField
        label="Role"
        options={ROLE_OPTIONS}
        {...form.register('role')}
        error={errors.role?.message && `Role ${errors.role.message}`}
      />
      <Button type="submit" variant="primary" className="mt-4" disabled={invite.isPending}>
        {invite.isPending ? 'Sending…' : 'Send invitation'}
      </Button>
      {sent ? (
        <p role="status" className="col-span-4 text-sm text-emerald-800">
          {sent}
        </p>
      ) : null}
      {formError ? (
        <p role="alert" className="col-span-4 text-sm text-red-700">
          {formError}
        </p>
      ) : null}
    </form>
  );
}
