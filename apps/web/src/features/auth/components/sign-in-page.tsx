import { zodResolver } from '@hookform/resolvers/zod';
import { signInRequest, type SignInRequest } from '@splitscope/contract';
import { useForm } from 'react-hook-form';
import { Link, Navigate, useLocation } from 'react-router-dom';
import { useMe } from '@/lib/api/me';
import { useSetupStatus } from '@/lib/api/setup-status';
import { useSignIn } from '../api/sign-in';
import { formSubmit } from '@/lib/form-submit';

export function SignInPage() {
  const me = useMe();
  const status = useSetupStatus();
  const signIn = useSignIn();
  const location = useLocation();
  const form = useForm<SignInRequest>({ resolver: zodResolver(signInRequest), defaultValues: { email: '', password: '' } });
  const from = (location.state as { from?: string } | null)?.from ?? '/';
  if (me.data) return <Navigate to={from} replace />;
  if (status.data?.needsSetup) return <Navigate to="/first-run" replace />;

  return (
    <main className="flex min-h-full flex-1 items-center justify-center bg-board p-4">
      <div className="w-full max-w-sm rounded-xl bg-white p-8 shadow-xl">
        <div className="mb-6 flex items-center gap-3">
          <img src="/favicon.svg" alt="" className="h-10 w-10" />
          <div>
            <h1 className="text-2xl font-semibold">Splitscope</h1>
            <p className="text-sm text-stone-600">Bench workbench for inverter control boards</p>
          </div>
        </div>
        <form onSubmit={formSubmit(form.handleSubmit((v) => signIn.mutate(v)))} className="space-y-4" noValidate>
          <label className="block">
            <span className="text-sm font-medium">E-mail</span>
            <input
              type="email"
              autoComplete="username"
              className="mt-1 block min-h-11 w-full rounded-md border border-stone-400 px-3 text-base"
              {...form.register('email')}
            />
            {form.formState.errors.email && <span className="text-sm text-high">{form.formState.errors.email.message}</span>}
          </label>
          <label className="block">
            <span className="text-sm font-medium">Password</span>
            <input
              type="password"
              autoComplete="current-password"
              className="mt-1 block min-h-11 w-full rounded-md border border-stone-400 px-3 text-base"
              {...form.register('password')}
            />
          </label>
          {signIn.error && (
            <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high">
              {signIn.error.message}
            </p>
          )}
          <button
            type="submit"
            disabled={signIn.isPending}
            className="min-h-11 w-full rounded-md bg-board px-4 font-semibold text-white hover:bg-teal-900 disabled:opacity-60"
          >
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </button>
        </form>
        <p className="mt-4 text-sm">
          <Link to="/forgot-password" className="underline">
            Forgot your password?
          </Link>
        </p>
        <p className="mt-6 text-xs text-stone-600">
          Mains and the ~300 V DC bus on these boards can kill. Follow your shop's procedures, local codes and licensed practice.
        </p>
      </div>
    </main>
  );
}
