import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { plainErrors } from '../../../lib/form-messages';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { errorMessage, summaryItems } from '../../../lib/form-errors';
import { resetRequestSchema, useRequestPasswordReset } from '../api/request-password-reset';

export function ForgotPasswordForm() {
  const form = useForm({ resolver: zodResolver(resetRequestSchema, plainErrors), defaultValues: { email: '' } });
  const request = useRequestPasswordReset();
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((values) => request.mutate(values));
  const items = summaryItems(isSubmitted ? errors : {}, 'forgot', request.error ? errorMessage(request.error) : null);

  if (request.isSuccess) {
    return (
      <Banner tone="ok" title="Check your inbox">
        If an account uses {request.variables.email}, a link to choose a new password is on its way. The link works for a limited
        time.
      </Banner>
    );
  }
  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      <Field id="forgot-email" label="E-mail" error={errors.email?.message}>
        {(a11y) => <Input {...a11y} type="email" autoComplete="email" {...form.register('email')} />}
      </Field>
      <Button type="submit" pending={request.isPending}>
        Send reset link
      </Button>
    </form>
  );
}
