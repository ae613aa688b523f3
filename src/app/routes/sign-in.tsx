// Sign-in: e-mail and password, with the server's message shown when it refuses.
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { loginSchema } from '@shared/schemas/auth';
import { useSignIn } from '@/features/auth/api/sign-in';
import { useMe } from '@/features/auth/api/get-me';
import { Field, Input } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { Logo } from '@/components/layout/logo';

type LoginInput = z.input<typeof loginSchema>;

export default function SignIn() {
  const { data: me } = useMe();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const { register, handleSubmit, formState } = useForm<LoginInput>({ resolver: zodResolver(loginSchema) });
  const next = params.get('next') || '/';
  if (me) return <Navigate to={next} replace />;

  return (
    <div className="flex min-h-screen">
      <div className="hidden w-[42%] flex-col justify-between bg-ink-900 p-10 lg:flex">
        <Logo />
        <div>
          <svg aria-hidden viewBox="0 0 320 180" className="mb-6 w-full max-w-sm">
            <path d="M10 20 C 40 40, 60 70, 160 95 S 280 130, 310 170" stroke="#c06a35" strokeWidth="3" fill="none" />
            <path d="M10 165 C 80 150, 140 110, 200 80 S 270 50, 300 48" stroke="#56668c" strokeWidth="2" strokeDasharray="5 5" fill="none" />
            <line x1="10" y1="170" x2="310" y2="170" stroke="#2c3c63" />
            <line x1="10" y1="10" x2="10" y2="170" stroke="#2c3c63" />
          </svg>
          <p className="max-w-sm text-lg leading-snug text-white">Every electrode build, its curves and its numbers at stated conditions — and the next build worth making.</p>
        </div>
        <p className="text-xs text-ink-300">HT-PEM and PGM-free electrode development</p>
      </div>
      <div className="flex flex-1 items-center justify-center p-6">
        <form
          className="w-full max-w-sm space-y-4"
          onSubmit={handleSubmit((values) => signIn.mutate(values, { onSuccess: () => navigate(next, { replace: true }) }))}
          noValidate
        >
          <div>
            <h1 className="text-xl font-semibold text-ink-950">Sign in</h1>
            <p className="mt-1 text-sm text-ink-500">Use the e-mail address your project PI invited.</p>
          </div>
          <Field label="E-mail" error={formState.errors.email?.message}>
            {(p) => <Input {...p} type="email" autoComplete="username" {...register('email')} />}
          </Field>
          <Field label="Password" error={formState.errors.password?.message}>
            {(p) => <Input {...p} type="password" autoComplete="current-password" {...register('password')} />}
          </Field>
          <ErrorNote error={signIn.error} />
          <Button type="submit" variant="primary" className="w-full" disabled={signIn.isPending}>
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </Button>
        </form>
      </div>
    </div>
  );
}
