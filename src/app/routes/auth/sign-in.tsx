import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { loginBodySchema, type LoginBody } from '@shared/schemas/auth';
import { useSignIn } from '@/features/auth/api/sign-in';
import { AuthFrame } from '@/features/auth/components/auth-frame';
import { TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { paths } from '@shared/paths';

/** Only same-app paths are followed after sign-in (no open redirect). */
function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : paths.home.to();
}

export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const form = useForm<LoginBody>({ resolver: zodResolver(loginBodySchema), defaultValues: { email: '', password: '' } });

  return (
    <AuthFrame title="Sign in to Luxtrail" subtitle="Use the e-mail address your organisation invited." footer={<Link className="font-medium text-lamp-700 underline" to={paths.forgotPassword.to()}>Forgotten your password?</Link>}>
      <form noValidate className="flex flex-col gap-4" onSubmit={form.handleSubmit((v) => signIn.mutate(v, { onSuccess: () => navigate(safeNext(params.get('next')), { replace: true }) }))}>
        <TextField label="E-mail" type="email" autoComplete="username" autoFocus {...form.register('email')} error={form.formState.errors.email?.message} />
        <TextField label="Password" type="password" autoComplete="current-password" {...form.register('password')} error={form.formState.errors.password?.message} />
        <FormError error={signIn.error} />
        <Button type="submit" busy={signIn.isPending}>Sign in</Button>
      </form>
    </AuthFrame>
  );
}
