import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { tokenPasswordBodySchema, type TokenPasswordBody } from '@shared/schemas/auth';
import { useRedeemToken, useTokenInfo } from '@/features/auth/api/token-links';
import { AuthFrame } from '@/features/auth/components/auth-frame';
import { TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { ErrorState, Spinner } from '@/components/ui/states';
import { paths } from '@shared/paths';

/** Accepting an invitation and resetting a password: both set a password from an e-mailed link. */
export function TokenPasswordRoute({ purpose }: { purpose: 'invite' | 'reset' }) {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const info = useTokenInfo(token);
  const redeem = useRedeemToken(purpose);
  const navigate = useNavigate();
  const form = useForm<TokenPasswordBody>({ resolver: zodResolver(tokenPasswordBodySchema), defaultValues: { token, password: '', confirmPassword: '' } });
  const title = purpose === 'invite' ? 'Join your team on Luxtrail' : 'Choose a new password';

  if (!token) return <AuthFrame title={title}><ErrorState title="This link is incomplete" error={new Error('Open the link from your e-mail in full, or ask for a new one.')} /></AuthFrame>;
  if (info.isPending) return <AuthFrame title={title}><Spinner label="Checking your link…" /></AuthFrame>;
  if (info.isError) {
    return (
      <AuthFrame title={title} footer={<Link className="font-medium text-lamp-700 underline" to={purpose === 'invite' ? paths.signIn.to() : paths.forgotPassword.to()}>{purpose === 'invite' ? 'Go to sign-in' : 'Ask for a new link'}</Link>}>
        <ErrorState error={info.error} />
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title={title} subtitle={purpose === 'invite' ? <>You were invited to <strong>{info.data.organizationName}</strong> as {info.data.email}.</> : <>For {info.data.email}.</>}>
      <form noValidate className="flex flex-col gap-4" onSubmit={form.handleSubmit((v) => redeem.mutate({ ...v, token }, { onSuccess: () => navigate(paths.home.to(), { replace: true }) }))}>
        <TextField label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." {...form.register('password')} error={form.formState.errors.password?.message} />
        <TextField label="Repeat the password" type="password" autoComplete="new-password" {...form.register('confirmPassword')} error={form.formState.errors.confirmPassword?.message} />
        <FormError error={redeem.error} />
        <Button type="submit" busy={redeem.isPending}>{purpose === 'invite' ? 'Set password and sign in' : 'Save and sign in'}</Button>
      </form>
    </AuthFrame>
  );
}
