import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Link } from 'react-router';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { Select } from '../../../components/select.tsx';
import { paths } from '../../../config/paths.ts';
import { fieldErrorsOf, isApiError } from '../../../lib/api-client.ts';
import { roles } from '../../../lib/roles.ts';
import { useInviteUser } from '../api/invite-user.ts';
import { roleOptions } from './role-options.ts';

const schema = z.object({
  email: z.email('Enter an e-mail address, like name@example.com.'),
  name: z.string().trim().min(1, 'Enter their name.').max(120, 'Use at most 120 characters.'),
  role: z.enum(roles),
});
type Values = z.infer<typeof schema>;

/** Invite a person by e-mail with a role; the link arrives by mail (and in the Outbox). */
export function InviteForm() {
  const invite = useInviteUser();
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { email: '', name: '', role: 'engineer' } });

  const onSubmit = handleSubmit((values) => {
    invite.mutate(values, {
      onSuccess: () => reset({ email: '', name: '', role: values.role }),
      onError: (error) => {
        // "email: … already has an account" belongs beside the e-mail field.
        const fields = fieldErrorsOf(error);
        for (const key of ['email', 'name', 'role'] as const) {
          if (fields[key]) setError(key, { message: fields[key] });
        }
        if (isApiError(error) && error.code === 'user.exists') setError('email', { message: error.message.replace(/^email:\s*/, '') });
      },
    });
  });

  const handledInline = isApiError(invite.error) && (invite.error.code === 'user.exists' || Object.keys(fieldErrorsOf(invite.error)).length > 0);

  return (
    <Card aria-labelledby="invite-heading">
      <CardHeader title={<span id="invite-heading">Invite someone</span>} description="They get an e-mail with a link to set their password." />
      <CardBody>
        <form onSubmit={onSubmit} noValidate aria-label="Invite someone" className="space-y-4">
          <Input label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register('email')} />
          <Input label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
          <Select label="Role" options={roleOptions} error={errors.role?.message} {...register('role')} />
          {invite.isError && !handledInline && <ErrorMessage title="The invitation was not sent" error={invite.error} />}
          {invite.isSuccess && (
            <p role="status" className="rounded-md bg-emerald-50 px-3 py-2 text-xs text-emerald-800 dark:bg-emerald-500/10 dark:text-emerald-300">
              Invitation sent to <span className="font-mono">{invite.data.email}</span>.{' '}
              <Link to={paths.admin.outbox.getHref()} className="font-medium underline">
                Read it in the Outbox
              </Link>
            </p>
          )}
          <Button type="submit" loading={invite.isPending}>
            Send invitation
          </Button>
        </form>
      </CardBody>
    </Card>
  );
}
