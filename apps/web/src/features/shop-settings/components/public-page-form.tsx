import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { shopDescriptionSchema, shopSlugSchema } from '@revloop/contract';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input, controlClasses } from '../../../components/ui/input';
import { paths } from '../../../config/paths';
import { cn } from '../../../lib/cn';
import { applyFieldErrors, errorMessage, summaryItems } from '../../../lib/form-errors';
import { plainErrors } from '../../../lib/form-messages';
import type { Shop } from '@revloop/contract';
import { useUpdateShop } from '../api/update-shop';

// An empty address is allowed here (no page); the API's schema judges any address given.
const formSchema = z
  .object({
    slug: z.union([z.literal(''), shopSlugSchema]),
    description: shopDescriptionSchema,
    publicPage: z.boolean(),
  })
  .refine((v) => !v.publicPage || v.slug !== '', {
    path: ['slug'],
    message: 'Choose the page address before turning the public page on.',
  });
type FormValues = z.input<typeof formSchema>;
const FIELDS = ['slug', 'description', 'publicPage'] as const;

const defaultsOf = (shop: Shop): FormValues => ({
  slug: shop.slug ?? '',
  description: shop.description,
  publicPage: shop.publicPage,
});

/** The shop's public page: its address, a short description, and on or off. */
export function PublicPageForm({ shop, canEdit }: { shop: Shop; canEdit: boolean }) {
  const form = useForm<FormValues, unknown, z.output<typeof formSchema>>({
    resolver: zodResolver(formSchema, plainErrors),
    defaultValues: defaultsOf(shop),
  });
  const update = useUpdateShop();
  const { errors, isSubmitted, isDirty } = form.formState;
  const onSubmit = form.handleSubmit((values) =>
    update.mutate(
      { slug: values.slug || null, description: values.description, publicPage: values.publicPage },
      {
        onSuccess: (response) => form.reset(defaultsOf(response.data)),
        onError: (error) =>
          applyFieldErrors(error, FIELDS, (field, message) =>
            form.setError(field as (typeof FIELDS)[number], { message }),
          ),
      },
    ),
  );
  const items = summaryItems(
    isSubmitted ? errors : {},
    'public',
    update.error ? errorMessage(update.error) : null,
  );
  const url = shop.slug ? `${window.location.origin}${paths.publicShop.getHref(shop.slug)}` : null;

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={items} />
      {url && shop.publicPage && (
        <p className="text-sm text-ink-700">
          Your page is on at{' '}
          <a
            href={url}
            className="font-medium break-all text-accent-700 underline"
            target="_blank"
            rel="noreferrer"
          >
            {url}
          </a>
          . Share this link with customers: they see your packages at retail prices and start a tune
          from there.
        </p>
      )}
      <fieldset disabled={!canEdit} className="flex flex-col gap-4">
        <Field
          id="public-slug"
          label="Page address"
          hint={`Lowercase letters, digits and hyphens: ${window.location.origin}/s/your-address`}
          error={errors.slug?.message}
        >
          {(a11y) => (
            <Input {...a11y} autoComplete="off" spellCheck={false} {...form.register('slug')} />
          )}
        </Field>
        <Field
          id="public-description"
          label="Short description"
          hint="A sentence or two about the shop, shown under its name."
          error={errors.description?.message}
        >
          {(a11y) => (
            <textarea
              {...a11y}
              rows={3}
              className={cn(controlClasses, 'py-2')}
              {...form.register('description')}
            />
          )}
        </Field>
        <label className="flex items-start gap-2 text-sm text-ink-900">
          <input
            type="checkbox"
            className="mt-0.5 size-4 accent-accent-600"
            {...form.register('publicPage')}
          />
          <span>
            <span className="font-medium">Public page on</span>
            <span className="block text-ink-600">
              Off: the address answers "no page here" and nobody can start a tune from it.
            </span>
          </span>
        </label>
      </fieldset>
      {canEdit && (
        <div className="flex justify-end">
          <Button type="submit" pending={update.isPending} disabled={!isDirty}>
            Save public page
          </Button>
        </div>
      )}
    </form>
  );
}
