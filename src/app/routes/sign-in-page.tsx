import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthFrame } from '../../components/auth-frame';
import { Button } from '../../components/button';
import { Notice } from '../../components/notice';
import { TextField } from '../../components/text-field';
import { signInInputSchema, useSignIn } from '../../features/auth/api/sign-in';
import { useFieldErrors } from '../../lib/use-field-errors';

/** Where to go after signing in: the page that sent us here, if it is one of ours. */
export function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}

export default function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const fields = useFieldErrors();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = fields.check(signInInputSchema, { email, password });
    if (!input) return;
    signIn.mutate(input, { onSuccess: () => navigate(safeNext(params.get('next')), { replace: true }), onError: fields.fromServer });
  };

  return (
    <AuthFrame title="Sign in">
      <form onSubmit={submit} noValidate className="flex flex-col gap-2">
        {safeNext(params.get('next')) !== '/' && <Notice>Sign in to continue where you were.</Notice>}
        <TextField label="E-mail" type="email" autoComplete="email" value={email} onChange={(event) => setEmail(event.target.value)} error={fields.errors.email} required />
        <TextField label="Password" type="password" autoComplete="current-password" value={password} onChange={(event) => setPassword(event.target.value)} error={fields.errors.password} required />
        {signIn.isError && !fields.errors.email && !fields.errors.password && <Notice tone="error">{signIn.error.message}</Notice>}
        <Button type="submit" busy={signIn.isPending} className="mt-2">
          Sign in
        </Button>
        <div className="mt-4 flex justify-between text-sm">
          <Link className="text-brass-600 underline dark:text-brass-400" to="/forgot-password">
            Forgot your password?
          </Link>
          <Link className="text-brass-600 underline dark:text-brass-400" to={`/register${params.get('next') ? `?next=${encodeURIComponent(params.get('next') as string)}` : ''}`}>
            Create an account
          </Link>
        </div>
      </form>
    </AuthFrame>
  );
}
