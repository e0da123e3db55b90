import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CANONICAL_CHANNELS, CHANNEL_INFO, logRequestSchema, type LogRequest } from '@revloop/domain/datalog';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';
import { FormErrorSummary } from '../../../components/ui/form-error-summary';
import { Input, controlClasses } from '../../../components/ui/input';
import { cn } from '../../../lib/cn';
import { errorMessage, summaryItems } from '../../../lib/form-errors';
import { plainErrors } from '../../../lib/form-messages';
import { useUpdateLogRequest } from '../api/update-log-request';
import { asNumber } from './intake-vehicle-fields';

function LogRequestView({ request }: { request: LogRequest }) {
  return (
    <div className="flex flex-col gap-3 text-sm text-ink-800">
      <p>
        Warm up about <strong>{request.warmupMinutes} minutes</strong>, drive normally a few minutes, then pull{' '}
        <strong>
          {request.wotGears} {request.wotGears === 1 ? 'gear' : 'gears'}
        </strong>{' '}
        at full throttle with the pedal on the floor.
      </p>
      <div>
        <p className="font-medium text-ink-900">Channels to log</p>
        <ul className="mt-1 flex flex-wrap gap-1.5">
          {request.channels.map((channel) => (
            <li key={channel} className="rounded-full bg-ink-100 px-2.5 py-0.5 text-xs text-ink-800">
              {CHANNEL_INFO[channel].label}
            </li>
          ))}
        </ul>
      </div>
      {request.notes && <p className="whitespace-pre-line text-ink-700">{request.notes}</p>}
    </div>
  );
}

function LogRequestForm({ jobId, request, onDone }: { jobId: string; request: LogRequest; onDone: () => void }) {
  const form = useForm({ resolver: zodResolver(logRequestSchema, plainErrors), defaultValues: request });
  const update = useUpdateLogRequest();
  const { errors, isSubmitted } = form.formState;
  const onSubmit = form.handleSubmit((logRequest) => update.mutate({ jobId, logRequest }, { onSuccess: onDone }));
  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      <FormErrorSummary items={summaryItems(isSubmitted ? errors : {}, 'log-request', update.error ? errorMessage(update.error) : null)} />
      <fieldset>
        <legend id="log-request-channels" className="mb-2 text-sm font-medium text-ink-800">
          Channels
        </legend>
        <div className="grid gap-x-4 gap-y-1.5 sm:grid-cols-2">
          {CANONICAL_CHANNELS.map((channel) => (
            <label key={channel} className="flex items-center gap-2 text-sm text-ink-800">
              <input type="checkbox" value={channel} className="size-4 accent-accent-600" {...form.register('channels')} />
              {CHANNEL_INFO[channel].label}
            </label>
          ))}
        </div>
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="log-request-warmupMinutes" label="Warm-up (minutes)" error={errors.warmupMinutes?.message}>
          {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...form.register('warmupMinutes', asNumber)} />}
        </Field>
        <Field id="log-request-wotGears" label="Full-throttle gears" error={errors.wotGears?.message}>
          {(a11y) => <Input {...a11y} type="number" inputMode="numeric" {...form.register('wotGears', asNumber)} />}
        </Field>
      </div>
      <Field id="log-request-notes" label="Notes for the customer" error={errors.notes?.message}>
        {(a11y) => <textarea {...a11y} rows={3} className={cn(controlClasses, 'py-2')} {...form.register('notes')} />}
      </Field>
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onDone} disabled={update.isPending}>
          Cancel
        </Button>
        <Button type="submit" pending={update.isPending}>
          Save log request
        </Button>
      </div>
    </form>
  );
}

/** What the next log must hold; the tuner on the job (or the owner) can change it. */
export function LogRequestCard({ jobId, request, canEdit }: { jobId: string; request: LogRequest; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  return (
    <Card
      title="Log request"
      description="What the next datalog should record."
      actions={
        canEdit && !editing ? (
          <Button size="sm" variant="secondary" onClick={() => setEditing(true)}>
            Edit log request
          </Button>
        ) : undefined
      }
    >
      {editing ? <LogRequestForm jobId={jobId} request={request} onDone={() => setEditing(false)} /> : <LogRequestView request={request} />}
    </Card>
  );
}
