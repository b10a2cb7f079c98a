import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router';
import { MailCheck } from 'lucide-react';
import { forgotPasswordBodySchema, type ForgotPasswordBody } from '@shared/schemas/auth';
import { useForgotPassword } from '@/features/auth/api/token-links';
import { AuthFrame } from '@/features/auth/components/auth-frame';
import { TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { paths } from '@shared/paths';

export function ForgotPasswordRoute() {
  const forgot = useForgotPassword();
  const form = useForm<ForgotPasswordBody>({ resolver: zodResolver(forgotPasswordBodySchema), defaultValues: { email: '' } });
  return (
    <AuthFrame title="Reset your password" subtitle="We e-mail a link that works once, for one hour." footer={<Link className="font-medium text-lamp-700 underline" to={paths.signIn.to()}>Back to sign-in</Link>}>
      {forgot.isSuccess ? (
        <div role="status" className="flex gap-3 rounded-lg bg-meets-50 p-4 text-sm text-meets-700 ring-1 ring-meets-100">
          <MailCheck className="h-5 w-5 shrink-0" aria-hidden />
          If that address has an account, a reset link is on its way.
        </div>
      ) : (
        <form noValidate className="flex flex-col gap-4" onSubmit={form.handleSubmit((v) => forgot.mutate(v))}>
          <TextField label="E-mail" type="email" autoComplete="username" {...form.register('email')} error={form.formState.errors.email?.message} />
          <FormError error={forgot.error} />
          <Button type="submit" busy={forgot.isPending}>Send the link</Button>
        </form>
      )}
    </AuthFrame>
  );
}
