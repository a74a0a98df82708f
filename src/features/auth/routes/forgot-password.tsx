import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Link } from 'react-router';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { paths } from '../../../config/paths.ts';
import { useForgotPassword } from '../api/forgot-password.ts';
import { AuthHeading } from '../components/auth-card.tsx';

const schema = z.object({ email: z.email('Enter an e-mail address, like name@example.com.') });
type Values = z.infer<typeof schema>;

export function ForgotPasswordRoute() {
  const forgot = useForgotPassword();
  const {
    register,
    handleSubmit,
    getValues,
    formState: { errors },
  } = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { email: '' } });

  if (forgot.isSuccess) {
    return (
      <>
        <AuthHeading title="Check your e-mail">
          If <span className="font-mono">{getValues('email')}</span> has a Parley account, a link to choose a new password is on its way. The link works once.
        </AuthHeading>
        <Link to={paths.auth.signIn.getHref()} className="text-sm font-medium text-amber-700 hover:underline dark:text-amber-400">
          Back to sign in
        </Link>
      </>
    );
  }

  return (
    <>
      <AuthHeading title="Forgot your password?">Enter your e-mail and we will send you a link to choose a new one.</AuthHeading>
      <form onSubmit={handleSubmit((values) => forgot.mutate(values))} noValidate className="space-y-4" aria-label="Request a password reset">
        <Input label="E-mail" type="email" autoComplete="username" autoFocus error={errors.email?.message} {...register('email')} />
        {forgot.isError && <ErrorMessage title="The request failed" error={forgot.error} />}
        <Button type="submit" className="w-full" loading={forgot.isPending}>
          Send reset link
        </Button>
        <p className="text-center">
          <Link to={paths.auth.signIn.getHref()} className="text-xs font-medium text-amber-700 hover:underline dark:text-amber-400">
            Back to sign in
          </Link>
        </p>
      </form>
    </>
  );
}
