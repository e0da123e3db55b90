import { useState } from 'react';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useNotificationPreferences } from '../api/get-notification-preferences';
import { useUpdateNotificationPreferences } from '../api/update-notification-preferences';

/** One switch per kind of notice: in-app always, e-mail when ticked. */
export function NotificationPreferencesForm() {
  const prefs = useNotificationPreferences();
  const update = useUpdateNotificationPreferences();
  const [draft, setDraft] = useState<Record<string, boolean>>({});
  if (prefs.isPending) return <Spinner label="Loading preferences" />;
  if (prefs.isError) return <Banner tone="bad">{errorMessage(prefs.error)}</Banner>;
  const value = (kind: string, saved: boolean) => draft[kind] ?? saved;
  const changed = prefs.data.data.some((p) => value(p.kind, p.email) !== p.email);

  return (
    <form
      className="flex flex-col gap-4"
      onSubmit={(event) => {
        event.preventDefault();
        update.mutate(Object.fromEntries(prefs.data.data.map((p) => [p.kind, { email: value(p.kind, p.email) }])), { onSuccess: () => setDraft({}) });
      }}
    >
      <fieldset>
        <legend className="mb-2 text-sm text-ink-700">Every notice shows under the bell. Tick the ones you also want by e-mail.</legend>
        <div className="flex flex-col gap-2">
          {prefs.data.data.map((p) => (
            <label key={p.kind} className="flex items-center gap-2 text-sm text-ink-900">
              <input type="checkbox" className="size-4 accent-accent-600" checked={value(p.kind, p.email)} onChange={(event) => setDraft((d) => ({ ...d, [p.kind]: event.target.checked }))} />
              E-mail me when {p.label.charAt(0).toLowerCase() + p.label.slice(1)}
            </label>
          ))}
        </div>
      </fieldset>
      {update.error && (
        <p role="alert" className="text-sm text-bad">
          {errorMessage(update.error)}
        </p>
      )}
      {update.isSuccess && !changed && <p role="status" className="text-sm text-ok">Saved.</p>}
      <div>
        <Button type="submit" pending={update.isPending} disabled={!changed}>
          Save e-mail settings
        </Button>
      </div>
    </form>
  );
}
