import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { Me } from '@revloop/contract';
import { plainErrors } from '../../../lib/form-messages';
import { ROLE_LABELS } from '@revloop/domain/auth';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { formatDateTime } from '../../../lib/format';
import { applyFieldErrors, errorMessage, summaryItems } from '../../../lib/form-errors';
import { acceptInvitationSchema, useAcceptInvitation } from '../api/accept-invitation';
import type { InvitationLookup } from '@revloop/contract';

const FIELDS = ['name', 'password'] as const;

export function InvitationSummary({ invitation }: { invitation: InvitationLookup }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 rounded-lg bg-accent-50 p-4 text-sm">
      <dt className="text-ink-600">Shop</dt>
      <dd className="font-medium text-ink-900">{invitation.shopName}</dd>
      <dt className="text-ink-600">Role</dt>
      <dd className="font-medium text-ink-900">{ROLE_LABELS[invitation.role]}</dd>
      {invitation.dealerName && (
        <>
          <dt className="text-ink-600">Dealer</dt>
          <dd className="font-medium text-ink-900">{invitation.dealerName}</dd>
        </>
      )}
      <dt className="text-ink-600">E-mail</dt>
      <dd className="break-all text-ink-900">{invitation.email}</dd>
      <dt className="text-ink-600">Valid until</dt>
      <dd className="text-ink-900">{formatDateTime(invitation.expiresAt)}</dd>
    </dl>
  );
}

export function AcceptInvitationForm({ token, onSuccess }: { token: string; onSuccess: (me: Me) => void }) {
  const form = useForm({ resolver: zodResolver(acceptInvitationSchema, plainErrors), defaultValues: { name: '', password: '' } });
  const accept = useAcceptInvitation();
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((values) =>
    accept.mutate(
      { token, ...values },
      { onSuccess, onError: (error) => applyFieldErrors(error, FIELDS, (field, message) => form.setError(field as (typeof FIELDS)[number], { message })) },
    ),
  );
  const items = summaryItems(isSubmitted ? errors : {}, 'accept', accept.error ? errorMessage(accept.error) : null);

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      <Field id="accept-name" label="Your name" error={errors.name?.message}>
        {(a11y) => <Input {...a11y} autoComplete="name" {...form.register('name')} />}
      </Field>
      <Field id="accept-password" label="Choose a password" hint="At least 10 characters." error={errors.password?.message}>
        {(a11y) => <Input {...a11y} type="password" autoComplete="new-password" {...form.register('password')} />}
      </Field>
      <Button type="submit" pending={accept.isPending}>
        Accept and sign in
      </Button>
    </form>
  );
}
