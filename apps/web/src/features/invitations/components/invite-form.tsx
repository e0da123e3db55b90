import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { plainErrors } from '../../../lib/form-messages';
import { ROLE_LABELS, SHOP_ROLES } from '@revloop/domain/auth';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { applyFieldErrors, errorMessage, summaryItems } from '../../../lib/form-errors';
import { createInvitationSchema, useCreateInvitation } from '../api/create-invitation';

const FIELDS = ['email', 'role', 'dealerId'] as const;
const ROLE_OPTIONS = SHOP_ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));

export interface InviteFormProps {
  /** Dealers to choose from when the role is dealer. */
  dealers: ReadonlyArray<{ id: string; name: string }>;
  /** Invites a user of this dealer only: the role and dealer are fixed. */
  fixedDealer?: { id: string; name: string };
  idPrefix?: string;
}

export function InviteForm({ dealers, fixedDealer, idPrefix = 'invite' }: InviteFormProps) {
  const defaults = { email: '', role: fixedDealer ? ('dealer' as const) : ('tuner' as const), dealerId: fixedDealer?.id ?? '' };
  const form = useForm({ resolver: zodResolver(createInvitationSchema, plainErrors), defaultValues: defaults });
  const create = useCreateInvitation();
  const role = useWatch({ control: form.control, name: 'role' });
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: () => form.reset({ ...defaults, role: values.role, dealerId: fixedDealer?.id ?? values.dealerId ?? '' }),
      onError: (error) => applyFieldErrors(error, FIELDS, (field, message) => form.setError(field as (typeof FIELDS)[number], { message })),
    }),
  );
  const items = summaryItems(isSubmitted ? errors : {}, idPrefix, create.error ? errorMessage(create.error) : null);
  const dealerOptions = [{ value: '', label: dealers.length ? 'Choose a dealer' : 'No dealers yet' }, ...dealers.map((dealer) => ({ value: dealer.id, label: dealer.name }))];

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      {create.isSuccess && !form.formState.isDirty && (
        <Banner tone="ok">Invitation sent to {create.data.data.email}. It appears under pending invitations until it is accepted.</Banner>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id={`${idPrefix}-email`} label="E-mail" error={errors.email?.message}>
          {(a11y) => <Input {...a11y} type="email" autoComplete="off" {...form.register('email')} />}
        </Field>
        {fixedDealer ? (
          <input type="hidden" {...form.register('role')} />
        ) : (
          <Field id={`${idPrefix}-role`} label="Role" error={errors.role?.message}>
            {(a11y) => <Select {...a11y} options={ROLE_OPTIONS} {...form.register('role')} />}
          </Field>
        )}
        {!fixedDealer && role === 'dealer' && (
          <Field id={`${idPrefix}-dealerId`} label="Dealer" error={errors.dealerId?.message}>
            {(a11y) => <Select {...a11y} options={dealerOptions} {...form.register('dealerId')} />}
          </Field>
        )}
      </div>
      <div>
        <Button type="submit" pending={create.isPending}>
          Send invitation
        </Button>
      </div>
    </form>
  );
}
