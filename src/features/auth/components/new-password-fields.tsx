import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { MIN_PASSWORD_LENGTH, newPasswordSchema, type NewPasswordInput } from '@shared/model/team';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';

/** New password typed twice (shared by the invitation and reset pages). */
export function NewPasswordForm({
  submitLabel,
  pending,
  error,
  onSubmit,
  username,
}: {
  readonly submitLabel: string;
  readonly pending: boolean;
  readonly error: string | null;
  readonly onSubmit: (password: string) => void;
  /** The account's address, for password managers. */
  readonly username?: string;
}) {
  const form = useForm<NewPasswordInput>({
    resolver: zodResolver(newPasswordSchema),
    defaultValues: { password: '', confirm: '' },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit((v) => onSubmit(v.password));
  return (
    <form onSubmit={(e) => void submit(e)} noValidate className="flex flex-col gap-3">
      {username ? (
        <input
          type="email"
          name="username"
          autoComplete="username"
          value={username}
          readOnly
          hidden
        />
      ) : null}
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${MIN_PASSWORD_LENGTH} characters.`}
        {...form.register('password')}
        error={errors.password?.message && `New password ${errors.password.message}`}
      />
      <TextField
        label="Repeat the password"
        type="password"
        autoComplete="new-password"
        {...form.register('confirm')}
        error={errors.confirm?.message && `Repeated password ${errors.confirm.message}`}
      />
      {error ? (
        <p role="alert" className="text-sm text-red-700">
          {error}
        </p>
      ) : null}
      <Button type="submit" variant="primary" disabled={pending}>
        {pending ? 'Saving…' : submitLabel}
      </Button>
    </form>
  );
}
