import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { Link, useNavigate, useParams } from 'react-router';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { paths } from '../../../config/paths.ts';
import { useResetPassword } from '../api/reset-password.ts';
import { AuthHeading } from '../components/auth-card.tsx';
import { minPasswordLength, newPasswordSchema } from '../components/password-fields.ts';

type Values = z.infer<typeof newPasswordSchema>;

export function ResetPasswordRoute() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const reset = useResetPassword();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<Values>({ resolver: zodResolver(newPasswordSchema), defaultValues: { password: '', confirm: '' } });

  const onSubmit = handleSubmit(({ password }) => {
    reset.mutate({ token, password }, { onSuccess: () => void navigate(paths.home.getHref(), { replace: true }) });
  });

  return (
    <>
      <AuthHeading title="Choose a new password">You will be signed in once it is set.</AuthHeading>
      <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Choose a new password">
        <Input
          label="New password"
          type="password"
          autoComplete="new-password"
          autoFocus
          hint={`At least ${minPasswordLength} characters.`}
          error={errors.password?.message}
          {...register('password')}
        />
        <Input label="Repeat the new password" type="password" autoComplete="new-password" error={errors.confirm?.message} {...register('confirm')} />
        {reset.isError && (
          <ErrorMessage title="The password was not changed" error={reset.error}>
            <Link to={paths.auth.forgotPassword.getHref()} className="mt-1 inline-block text-xs font-medium underline">
              Ask for a new link
            </Link>
          </ErrorMessage>
        )}
        <Button type="submit" className="w-full" loading={reset.isPending}>
          Set password and sign in
        </Button>
      </form>
    </>
  );
}
