import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { plainErrors } from '../../../lib/form-messages';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { errorMessage, summaryItems } from '../../../lib/form-errors';
import { resetConfirmSchema, useConfirmPasswordReset } from '../api/confirm-password-reset';

export function ResetPasswordForm({ token, onSuccess }: { token: string; onSuccess: () => void }) {
  const form = useForm({ resolver: zodResolver(resetConfirmSchema, plainErrors), defaultValues: { token, password: '' } });
  const confirm = useConfirmPasswordReset();
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((values) => confirm.mutate(values, { onSuccess }));
  const tokenError = errors.token ? 'This reset link is incomplete. Ask for a new one.' : null;
  const items = summaryItems(isSubmitted ? { password: errors.password } : {}, 'reset', tokenError ?? (confirm.error ? errorMessage(confirm.error) : null));

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      <input type="hidden" {...form.register('token')} />
      <Field id="reset-password" label="New password" hint="At least 10 characters." error={errors.password?.message}>
        {(a11y) => <Input {...a11y} type="password" autoComplete="new-password" {...form.register('password')} />}
      </Field>
      <Button type="submit" pending={confirm.isPending}>
        Set new password
      </Button>
    </form>
  );
}
