import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthFrame } from '../../components/auth-frame';
import { Button } from '../../components/button';
import { Notice } from '../../components/notice';
import { TextField } from '../../components/text-field';
import { registerInputSchema, useRegister } from '../../features/auth/api/register';
import { NewPasswordField } from '../../components/new-password-field';
import { passwordProblem } from '../../lib/password-rules';
import { useFieldErrors } from '../../lib/use-field-errors';
import { safeNext } from './sign-in-page';

export default function RegisterPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const register = useRegister();
  const fields = useFieldErrors();
  const [form, setForm] = useState({ displayName: '', email: '', password: '' });
  const [weakness, setWeakness] = useState<string | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = fields.check(registerInputSchema, form);
    if (!input) return;
    const weak = passwordProblem(input.password, input.email);
    setWeakness(weak);
    if (weak) return;
    register.mutate(input, { onSuccess: () => navigate(safeNext(params.get('next')), { replace: true }), onError: fields.fromServer });
  };

  return (
    <AuthFrame title="Create your account">
      <form onSubmit={submit} noValidate className="flex flex-col gap-2">
        <TextField label="Your name" autoComplete="name" value={form.displayName} onChange={(event) => setForm({ ...form, displayName: event.target.value })} error={fields.errors.displayName} />
        <TextField label="E-mail" type="email" autoComplete="email" value={form.email} onChange={(event) => setForm({ ...form, email: event.target.value })} error={fields.errors.email} />
        <NewPasswordField label="Password" value={form.password} onValueChange={(password) => setForm({ ...form, password })} weakness={weakness} serverError={fields.errors.password} />
        {register.isError && Object.keys(fields.errors).length === 0 && <Notice tone="error">{register.error.message}</Notice>}
        <Button type="submit" busy={register.isPending} className="mt-2">
          Create account
        </Button>
        <p className="mt-4 text-sm">
          Already have one?{' '}
          <Link className="text-brass-600 underline dark:text-brass-400" to="/sign-in">
            Sign in
          </Link>
        </p>
      </form>
    </AuthFrame>
  );
}
