import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { paths, safeReturnPath } from '../../../config/paths.ts';
import { isApiError } from '../../../lib/api-client.ts';
import { useSignIn } from '../api/sign-in.ts';
import { AuthHeading } from '../components/auth-card.tsx';

const schema = z.object({
  email: z.email('Enter an e-mail address, like name@example.com.'),
  password: z.string().min(1, 'Enter your password.'),
});

type Values = z.infer<typeof schema>;

function signInProblem(error: unknown): string {
  if (isApiError(error) && error.status === 401) return 'That e-mail and password do not match an active account.';
  if (isApiError(error)) return error.message;
  return 'Signing in failed. Try again.';
}

export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const next = safeReturnPath(params.get('next'));
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { email: '', password: '' } });

  const onSubmit = handleSubmit((values) => {
    signIn.mutate(values, { onSuccess: () => void navigate(next, { replace: true }) });
  });

  return (
    <>
      <AuthHeading title="Sign in">Use the account your Parley admin set up for you.</AuthHeading>
      <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Sign in">
        <Input label="E-mail" type="email" autoComplete="username" autoFocus error={errors.email?.message} {...register('email')} />
        <div className="space-y-1.5">
          <Input label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...register('password')} />
          <p className="text-right">
            <Link to={paths.auth.forgotPassword.getHref()} className="text-xs font-medium text-amber-700 hover:underline dark:text-amber-400">
              Forgot password?
            </Link>
          </p>
        </div>
        {signIn.isError && <ErrorMessage title="Not signed in">{signInProblem(signIn.error)}</ErrorMessage>}
        <Button type="submit" className="w-full" loading={signIn.isPending}>
          Sign in
        </Button>
      </form>
    </>
  );
}
