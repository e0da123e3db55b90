import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { messageInputSchema } from '@revloop/domain/jobs';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';
import { controlClasses } from '../../../components/ui/input';
import { Spinner } from '../../../components/ui/spinner';
import { cn } from '../../../lib/cn';
import { errorMessage } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { plainErrors } from '../../../lib/form-messages';
import { useCreateJobMessage } from '../api/create-job-message';
import { useJobMessages } from '../api/get-job-messages';

/** The conversation between the customer (or dealer) and the shop about one job. */
export function MessageThread({ jobId, canPost }: { jobId: string; canPost: boolean }) {
  const messages = useJobMessages(jobId);
  const post = useCreateJobMessage(jobId);
  const form = useForm({ resolver: zodResolver(messageInputSchema, plainErrors), defaultValues: { body: '' } });
  const onSubmit = form.handleSubmit((values) => post.mutate(values, { onSuccess: () => form.reset({ body: '' }) }));

  return (
    <Card title="Messages">
      {messages.isPending ? (
        <Spinner label="Loading messages" />
      ) : messages.isError ? (
        <Banner tone="bad">{errorMessage(messages.error)}</Banner>
      ) : messages.data.data.length === 0 ? (
        <p className="text-sm text-ink-600">No messages yet.</p>
      ) : (
        <ol aria-label="Message thread" className="flex flex-col gap-3">
          {messages.data.data.map((message) => (
            <li key={message.id} className={cn('max-w-[85%] rounded-lg px-3 py-2 text-sm', message.mine ? 'self-end bg-accent-50 text-accent-900' : 'self-start bg-ink-100 text-ink-900')}>
              <p className="text-xs font-medium text-ink-700">
                {message.mine ? 'You' : message.author.name} · <time dateTime={message.createdAt}>{formatDateTime(message.createdAt)}</time>
              </p>
              <p className="mt-0.5 whitespace-pre-line">{message.body}</p>
            </li>
          ))}
        </ol>
      )}
      {canPost && (
        <form noValidate onSubmit={onSubmit} className="mt-4 flex flex-col gap-2">
          <Field id="message-body" label="New message" error={form.formState.errors.body?.message}>
            {(a11y) => <textarea {...a11y} rows={3} className={cn(controlClasses, 'py-2')} {...form.register('body')} />}
          </Field>
          {post.error && (
            <p role="alert" className="text-sm text-bad">
              {errorMessage(post.error)}
            </p>
          )}
          <div className="flex justify-end">
            <Button type="submit" pending={post.isPending}>
              Send message
            </Button>
          </div>
        </form>
      )}
    </Card>
  );
}
