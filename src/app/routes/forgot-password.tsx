import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router';
import type { z } from 'zod';
import { forgotSchema } from '#shared/api/auth';
import { Field, FormError } from '../../components/ui/field';
import { requestReset } from '../../features/auth/api';
import { ApiFailure } from '../../lib/api';
import { AuthFrame } from './login';

export function ForgotPasswordPage() {
  const [sent, setSent] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<z.input<typeof forgotSchema>>({ resolver: zodResolver(forgotSchema) });
  const submit = handleSubmit(async (v) => {
    setError(null);
    try {
      await requestReset(v.email);
      setSent(true);
    } catch (e) {
      setError(e instanceof ApiFailure ? e.message : 'the request failed');
    }
  });
  return (
    <AuthFrame title="Reset your password">
      {sent ? (
        <p role="status">If the address belongs to an account, an e-mail with a reset link is on its way. The link works once, for one hour.</p>
      ) : (
        <form onSubmit={submit} noValidate>
          <FormError message={error} />
          <Field id="email" label="E-mail" error={formState.errors.email?.message}>
            <input id="email" type="email" autoComplete="username" className="input" {...register('email')} />
          </Field>
          <button type="submit" className="btn-primary w-full" disabled={formState.isSubmitting}>
            Send the reset link
          </button>
        </form>
      )}
      <p className="mt-4 text-sm">
        <Link className="underline" to="/login">
          Back to sign in
        </Link>
      </p>
    </AuthFrame>
  );
}
