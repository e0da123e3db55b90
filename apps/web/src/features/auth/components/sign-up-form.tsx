import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { Me } from '@revloop/contract';
import { plainErrors } from '../../../lib/form-messages';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { applyFieldErrors, errorMessage, summaryItems } from '../../../lib/form-errors';
import { signUpSchema, useSignUp } from '../api/sign-up';

const FIELDS = ['shopName', 'name', 'email', 'password'] as const;

export function SignUpForm({ onSuccess }: { onSuccess: (me: Me) => void }) {
  const form = useForm({ resolver: zodResolver(signUpSchema, plainErrors), defaultValues: { shopName: '', name: '', email: '', password: '' } });
  const signUp = useSignUp();
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((values) =>
    signUp.mutate(values, {
      onSuccess,
      onError: (error) => applyFieldErrors(error, FIELDS, (field, message) => form.setError(field as (typeof FIELDS)[number], { message })),
    }),
  );
  const items = summaryItems(isSubmitted ? errors : {}, 'sign-up', signUp.error ? errorMessage(signUp.error) : null);

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      <Field id="sign-up-shopName" label="Shop name" error={errors.shopName?.message}>
        {(a11y) => <Input {...a11y} autoComplete="organization" {...form.register('shopName')} />}
      </Field>
      <Field id="sign-up-name" label="Your name" error={errors.name?.message}>
        {(a11y) => <Input {...a11y} autoComplete="name" {...form.register('name')} />}
      </Field>
      <Field id="sign-up-email" label="E-mail" error={errors.email?.message}>
        {(a11y) => <Input {...a11y} type="email" autoComplete="email" {...form.register('email')} />}
      </Field>
      <Field id="sign-up-password" label="Password" hint="At least 10 characters. A short sentence works well." error={errors.password?.message}>
        {(a11y) => <Input {...a11y} type="password" autoComplete="new-password" {...form.register('password')} />}
      </Field>
      <Button type="submit" pending={signUp.isPending} className="mt-2">
        Create shop
      </Button>
    </form>
  );
}
