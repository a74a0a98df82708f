import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Link, useNavigate, useParams } from 'react-router';
import { Badge } from '../../../components/badge.tsx';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { paths } from '../../../config/paths.ts';
import { roleLabels } from '../../../lib/roles.ts';
import { useAcceptInvite } from '../api/accept-invite.ts';
import { useInvite, type Invite } from '../api/get-invite.ts';
import { AuthHeading } from '../components/auth-card.tsx';
import { minPasswordLength, newPasswordSchema } from '../components/password-fields.ts';

const schema = newPasswordSchema.and(z.object({ name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.') }));
type Values = z.infer<typeof schema>;

export function AcceptInviteRoute() {
  const { token = '' } = useParams();
  const invite = useInvite(token);

  if (invite.isPending) {
    return (
      <p role="status" className="text-sm text-slate-500">
        Checking the invitation…
      </p>
    );
  }
  if (invite.isError) {
    return (
      <>
        <AuthHeading title="This invitation cannot be used">The link may have been used already, replaced by a newer invitation, or expired. Ask your Parley admin to invite you again.</AuthHeading>
        <ErrorMessage title="Invitation not found" error={invite.error} />
        <Link to={paths.auth.signIn.getHref()} className="mt-6 inline-block text-sm font-medium text-amber-700 hover:underline dark:text-amber-400">
          Go to sign in
        </Link>
      </>
    );
  }
  return <AcceptInviteForm token={token} invite={invite.data} />;
}

function AcceptInviteForm({ token, invite }: { token: string; invite: Invite }) {
  const navigate = useNavigate();
  const accept = useAcceptInvite();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { name: invite.name, password: '', confirm: '' } });

  const onSubmit = handleSubmit(({ name, password }) => {
    accept.mutate({ token, name, password }, { onSuccess: () => void navigate(paths.home.getHref(), { replace: true }) });
  });

  return (
    <>
      <AuthHeading title="Join Parley">Set your name and a password to activate your account.</AuthHeading>
      <dl className="mb-5 grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 rounded-md border border-slate-200 bg-slate-50 px-4 py-3 text-sm dark:border-slate-800 dark:bg-slate-900">
        <dt className="whitespace-nowrap text-slate-500 dark:text-slate-400">E-mail</dt>
        <dd className="min-w-0 font-mono break-all text-slate-900 dark:text-slate-100" data-testid="invite-email">
          {invite.email}
        </dd>
        <dt className="text-slate-500 dark:text-slate-400">Role</dt>
        <dd>
          <Badge tone="accent" mono>
            {roleLabels[invite.role] ?? invite.role}
          </Badge>
        </dd>
      </dl>
      <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Accept the invitation">
        <Input label="Your name" autoComplete="name" error={errors.name?.message} {...register('name')} />
        <Input label="Password" type="password" autoComplete="new-password" hint={`At least ${minPasswordLength} characters.`} error={errors.password?.message} {...register('password')} />
        <Input label="Repeat the password" type="password" autoComplete="new-password" error={errors.confirm?.message} {...register('confirm')} />
        {accept.isError && <ErrorMessage title="The account was not activated" error={accept.error} />}
        <Button type="submit" className="w-full" loading={accept.isPending}>
          Activate account
        </Button>
      </form>
    </>
  );
}
