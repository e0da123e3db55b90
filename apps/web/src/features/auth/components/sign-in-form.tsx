import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { Me } from '@revloop/contract';
import { plainErrors } from '../../../lib/form-messages';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { errorMessage, summaryItems } from '../../../lib/form-errors';
import { signInSchema, useSignIn } from '../api/sign-in';

export function SignInForm({ onSuccess }: { onSuccess: (me: Me) => void }) {
  const form = useForm({ resolver: zodResolver(signInSchema, plainErrors), defaultValues: { email: '', password: '' } });
  const signIn = useSignIn();
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((values) => signIn.mutate(values, { onSuccess }));
  const items = summaryItems(isSubmitted ? errors : {}, 'sign-in', signIn.error ? errorMessage(signIn.error) : null);

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      <Field id="sign-in-email" label="E-mail" error={errors.email?.message}>
        {(a11y) => <Input {...a11y} type="email" autoComplete="username" {...form.register('email')} />}
      </Field>
      <Field id="sign-in-password" label="Password" error={errors.password?.message}>
        {(a11y) => <Input {...a11y} type="password" autoComplete="current-password" {...form.register('password')} />}
      </Field>
      <div className="flex items-center justify-between gap-3">
        <TextLink to={paths.auth.forgotPassword.getHref()} className="text-sm">
          Forgot your password?
        </TextLink>
        <Button type="submit" pending={signIn.isPending}>
          Sign in
        </Button>
      </div>
    </form>
  );
}
