import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { z } from 'zod';
import { passwordSchema } from '#shared/api/auth';
import { Field, FormError } from '../../components/ui/field';
import { meQuery, resetPassword } from '../../features/auth/api';
import { ApiFailure } from '../../lib/api';
import { AuthFrame } from './login';

const formSchema = z
  .object({ password: passwordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'the two passwords differ' });

export function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const invite = params.get('invite') === '1';
  const navigate = useNavigate();
  const qc = useQueryClient();
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<z.infer<typeof formSchema>>({ resolver: zodResolver(formSchema) });
  const submit = handleSubmit(async (v) => {
    setError(null);
    try {
      const me = await resetPassword(token, v.password);
      qc.setQueryData(meQuery.queryKey, me);
      navigate('/');
    } catch (e) {
      setError(e instanceof ApiFailure ? e.message : 'the password could not be set');
    }
  });
  return (
    <AuthFrame title={invite ? 'Choose your password' : 'Choose a new password'}>
      {!token ? (
        <p>
          This page needs the link from your e-mail. <Link className="underline" to="/forgot-password">Ask for a new one</Link>.
        </p>
      ) : (
        <form onSubmit={submit} noValidate>
          <FormError message={error} />
          <Field id="password" label="New password" error={formState.errors.password?.message} hint="At least 10 characters; a phrase of several words is easy to remember.">
            <input id="password" type="password" autoComplete="new-password" className="input" {...register('password')} />
          </Field>
          <Field id="repeat" label="The same password again" error={formState.errors.repeat?.message}>
            <input id="repeat" type="password" autoComplete="new-password" className="input" {...register('repeat')} />
          </Field>
          <button type="submit" className="btn-primary w-full" disabled={formState.isSubmitting}>
            Save the password and sign in
          </button>
        </form>
      )}
    </AuthFrame>
  );
}
