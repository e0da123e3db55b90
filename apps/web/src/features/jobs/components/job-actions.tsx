import { useState, type ReactNode } from 'react';
import { useAbility } from '@casl/react';
import type { Job } from '@revloop/contract';
import { asSubject, type AppAbility } from '@revloop/domain/auth';
import type { AvailableTransition } from '@revloop/domain/jobs';
import { Button, type ButtonVariant } from '../../../components/ui/button';
import { ConfirmDialog, Dialog } from '../../../components/ui/dialog';
import { Field } from '../../../components/ui/field';
import { controlClasses } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { useSignedInMe } from '../../auth/api/get-me';
import { useMembers } from '../../members/api/get-members';
import { cn } from '../../../lib/cn';
import { errorMessage } from '../../../lib/form-errors';
import { usePopover } from '../../../lib/use-popover';
import { useAssignJob } from '../api/assign-job';
import { useMoveJob } from '../api/move-job';
import { useTakeJob } from '../api/take-job';

/** Moves that end or pause the work get a confirm step; the rest are one click. */
const CONFIRMED: Partial<Record<AvailableTransition['to'], string>> = {
  cancelled: 'The job stops here and cannot be reopened.',
  dialed_in: 'The current revision becomes the final calibration.',
  on_hold: 'The job waits until someone resumes it, e.g. when the payment or information arrives.',
};

const ASIDE = new Set<AvailableTransition['to']>(['on_hold', 'cancelled']);

const jobRef = (job: Job) => `job ${job.number} (${job.vehicle.description})`;

function AssignDialog({ job, open, onClose }: { job: Job; open: boolean; onClose: () => void }) {
  const members = useMembers();
  const assign = useAssignJob();
  const [tunerId, setTunerId] = useState(job.tuner?.id ?? '');
  const tuners = (members.data?.data ?? []).filter((m) => m.role === 'tuner' && m.status === 'active');
  return (
    <Dialog
      open={open}
      title={`Assign ${jobRef(job)}`}
      onClose={onClose}
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={assign.isPending}>
            Cancel
          </Button>
          <Button pending={assign.isPending} onClick={() => assign.mutate({ jobId: job.id, tunerId: tunerId || null }, { onSuccess: onClose })}>
            Save
          </Button>
        </>
      }
    >
      <Field id={`assign-${job.id}`} label="Tuner">
        {(a11y) => (
          <Select
            {...a11y}
            value={tunerId}
            onChange={(event) => setTunerId(event.target.value)}
            options={[{ value: '', label: 'Nobody (unassigned)' }, ...tuners.map((t) => ({ value: t.userId, label: t.name }))]}
          />
        )}
      </Field>
      {assign.error && (
        <p role="alert" className="mt-3 text-bad">
          {errorMessage(assign.error)}
        </p>
      )}
    </Dialog>
  );
}

/** Send revision: the "what changed" note the customer reads with the download is required (the server checks it too). */
function SendRevisionDialog({ job, transition, onClose }: { job: Job; transition: AvailableTransition; onClose: () => void }) {
  const move = useMoveJob();
  const [note, setNote] = useState('');
  const [touched, setTouched] = useState(false);
  const missing = note.trim() === '';
  const id = `send-note-${job.id}`;
  return (
    <Dialog
      open
      title={`${transition.label}: ${jobRef(job)}`}
      onClose={onClose}
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={move.isPending}>
            Cancel
          </Button>
          <Button
            pending={move.isPending}
            onClick={() => {
              setTouched(true);
              if (!missing) move.mutate({ jobId: job.id, to: transition.to, note: note.trim() }, { onSuccess: onClose });
            }}
          >
            Send to the customer
          </Button>
        </>
      }
    >
      <p className="mb-3">The customer gets the revision, this note and the flashing cautions by e-mail and on the job page.</p>
      <Field id={id} label="What changed" hint="In plain words for the customer, e.g. “More fuel at full throttle above 4,500 rpm.”" error={touched && missing ? 'Say what changed in this revision.' : undefined}>
        {(a11y) => <textarea {...a11y} rows={4} maxLength={2000} className={cn(controlClasses, 'py-2')} value={note} onChange={(e) => setNote(e.target.value)} />}
      </Field>
      {move.error && (
        <p role="alert" className="mt-3 text-bad">
          {errorMessage(move.error)}
        </p>
      )}
    </Dialog>
  );
}

/** Pause and cancel folded behind a button on a board card; Escape or a click outside closes it. */
function MoreActions({ job, children }: { job: Job; children: ReactNode }) {
  const { open, setOpen, rootRef, buttonProps, panelId } = usePopover();
  return (
    <div ref={rootRef} className="relative text-sm">
      <button
        {...buttonProps}
        aria-label={`More actions: ${jobRef(job)}`}
        className="flex items-center gap-1 rounded text-ink-600 hover:text-ink-900"
      >
        <span aria-hidden="true" className={cn('inline-block transition-transform', open && 'rotate-90')}>
          ▸
        </span>
        More actions
      </button>
      {open && (
        // A click on a move closes the panel; the move's own confirm dialog takes over from there.
        <div id={panelId} className="mt-2 flex flex-wrap gap-2" onClick={() => setOpen(false)}>
          {children}
        </div>
      )}
    </div>
  );
}

/**
 * The moves this viewer can make on a job now (from the API's `transitions`), plus take and assign.
 * Every action is a real button, so the board works from the keyboard.
 */
export function JobActions({ job, compact = false }: { job: Job; compact?: boolean }) {
  const size = compact ? 'sm' : 'md';
  const ability = useAbility<AppAbility>();
  const me = useSignedInMe();
  const move = useMoveJob();
  const take = useTakeJob();
  const [confirming, setConfirming] = useState<AvailableTransition | null>(null);
  const [kitOutOverride, setKitOutOverride] = useState(false);
  const [assigning, setAssigning] = useState(false);
  const [sending, setSending] = useState<AvailableTransition | null>(null);
  const subject = asSubject('Job', { shopId: me.shop?.id ?? '', assignedTunerId: job.tuner?.id ?? null, dealerId: job.dealer?.id ?? null, customerUserId: job.customer.id });
  const canTake = !job.tuner && ability.can('take', subject);
  const canAssign = ability.can('assign', 'Job');
  const error = move.error ?? take.error;

  // Pausing and cancelling sit apart from the forward moves, folded away on a board card.
  const main = job.transitions.filter((t) => !ASIDE.has(t.to));
  const aside = job.transitions.filter((t) => ASIDE.has(t.to));
  const button = (transition: AvailableTransition, variant: ButtonVariant) => (
    <Button
      key={transition.to}
      size={size}
      variant={variant}
      pending={move.isPending && move.variables?.to === transition.to && !confirming}
      disabled={move.isPending}
      onClick={() => (transition.needsNote ? setSending(transition) : CONFIRMED[transition.to] ? setConfirming(transition) : run(transition))}
      aria-label={`${transition.label}: ${jobRef(job)}`}
    >
      {transition.label}
    </Button>
  );

  const run = (transition: AvailableTransition) =>
    move.mutate({ jobId: job.id, to: transition.to, kitOutOverride: transition.to === 'dialed_in' && kitOutOverride }, { onSuccess: () => setConfirming(null) });
  // Offered once the server has refused Dialed in (e.g. a rental kit still out); only the owner may override, the server decides.
  const offerKitOverride = confirming?.to === 'dialed_in' && move.isError && me.role === 'owner';

  if (job.transitions.length === 0 && !canTake && !canAssign) return null;
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap gap-2">
        {canTake && (
          <Button size={size} variant="secondary" pending={take.isPending} onClick={() => take.mutate(job.id)} aria-label={`Take ${jobRef(job)}`}>
            Take
          </Button>
        )}
        {main.map((transition, index) => button(transition, index === 0 && !CONFIRMED[transition.to] ? 'primary' : 'secondary'))}
        {canAssign && (
          <Button size={size} variant="ghost" onClick={() => setAssigning(true)} aria-label={`${job.tuner ? 'Reassign' : 'Assign'} ${jobRef(job)}`}>
            {job.tuner ? 'Reassign' : 'Assign'}
          </Button>
        )}
        {!compact && aside.map((transition) => button(transition, transition.to === 'cancelled' ? 'ghost' : 'secondary'))}
      </div>
      {compact && aside.length > 0 && <MoreActions job={job}>{aside.map((transition) => button(transition, 'secondary'))}</MoreActions>}
      {error && !confirming && (
        <p role="alert" className="text-sm text-bad">
          {errorMessage(error)}
        </p>
      )}
      <ConfirmDialog
        open={confirming !== null}
        title={`${confirming?.label ?? ''}: ${jobRef(job)}?`}
        confirmLabel={confirming?.label ?? 'Confirm'}
        confirmVariant={confirming?.to === 'cancelled' ? 'danger' : 'primary'}
        pending={move.isPending}
        error={move.error ? errorMessage(move.error) : null}
        onConfirm={() => confirming && run(confirming)}
        onCancel={() => {
          setConfirming(null);
          setKitOutOverride(false);
          move.reset();
        }}
      >
        {confirming ? CONFIRMED[confirming.to] : null}
        {offerKitOverride && (
          <label className="mt-3 flex items-start gap-2 text-sm">
            <input type="checkbox" className="mt-1" checked={kitOutOverride} onChange={(e) => setKitOutOverride(e.target.checked)} />
            <span>Mark it dialed in anyway: the rental kit stays out and is still tracked on the job page.</span>
          </label>
        )}
      </ConfirmDialog>
      {sending && <SendRevisionDialog job={job} transition={sending} onClose={() => setSending(null)} />}
      {canAssign && assigning && <AssignDialog job={job} open={assigning} onClose={() => setAssigning(false)} />}
    </div>
  );
}
