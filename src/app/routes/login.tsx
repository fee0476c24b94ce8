import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { loginSchema, type LoginInput } from '#shared/api/auth';
import { Field, FormError } from '../../components/ui/field';
import { meQuery, rememberMe, signIn } from '../../features/auth/api';
import { flush } from '../../features/readings/outbox';
import { ApiFailure } from '../../lib/api';

export function AuthFrame({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <main className="mx-auto mt-12 max-w-md px-4">
      <p className="mb-2 text-lg font-semibold text-concrete-700">
        <span aria-hidden="true">⌒</span> Crownwatch
      </p>
      <div className="card">
        <h1 className="mb-4 text-2xl font-semibold">{title}</h1>
        {children}
      </div>
    </main>
  );
}

export function LoginPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const qc = useQueryClient();
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<LoginInput>({ resolver: zodResolver(loginSchema) });
  const submit = handleSubmit(async (v) => {
    setError(null);
    try {
      const me = await signIn(v);
      rememberMe(me);
      qc.setQueryData(meQuery.queryKey, me);
      void flush(); // readings kept on this tablet while the sign-in had expired go out now
      navigate(params.get('next') ?? (me.role === 'inspector' ? '/yard' : me.role === 'viewer' ? '/' : '/board'));
    } catch (e) {
      setError(e instanceof ApiFailure ? e.message : 'sign-in failed');
    }
  });
  return (
    <AuthFrame title="Sign in">
      <form onSubmit={submit} noValidate>
        <FormError message={error} />
        <Field id="email" label="E-mail" error={formState.errors.email?.message}>
          <input id="email" type="email" autoComplete="username" className="input" {...register('email')} />
        </Field>
        <Field id="password" label="Password" error={formState.errors.password?.message}>
          <input id="password" type="password" autoComplete="current-password" className="input" {...register('password')} />
        </Field>
        <button type="submit" className="btn-primary w-full" disabled={formState.isSubmitting}>
          Sign in
        </button>
      </form>
      <p className="mt-4 text-sm">
        <Link className="underline" to="/forgot-password">
          Forgot your password?
        </Link>
      </p>
    </AuthFrame>
  );
}
