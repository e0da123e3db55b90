import { useState, type FormEvent } from 'react';
import type { CalibrationFileKind, CalibrationModule, UploadJobFileResponse } from '@revloop/contract';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { controlClasses } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { errorMessage } from '../../../lib/form-errors';
import { ProgressBar } from '../../datalogs/components/progress-bar';
import { useUploadJobFile } from '../api/upload-job-file';
import { formatBytes } from './file-format';

const MODULE_OPTIONS = [
  { value: 'ECM', label: 'ECM (engine)' },
  { value: 'TCM', label: 'TCM (transmission)' },
  { value: 'other', label: 'Other' },
];

// Short names fit the select at any width; the chosen kind is explained in the hint below it.
const KIND_OPTIONS: Array<{ value: CalibrationFileKind; label: string; hint: string }> = [
  { value: 'read', label: 'Read', hint: 'The stock read, or any read off the car.' },
  { value: 're_read', label: 'Re-read', hint: 'Read back after flashing: proves what is on the car.' },
  { value: 'revision', label: 'Revision', hint: 'A calibration for the customer: saved as a draft until you send it.' },
];

function outcomeText({ data, meta }: UploadJobFileResponse): string {
  const parts = [`${data.label} stored as ${data.formatLabel}, ${formatBytes(data.imageBytes)} of data, CRC-32 ${data.crc32Hex}.`];
  if (data.draft) parts.push('Saved as a draft: only the shop sees it until it is sent.');
  if (meta.waitingFor.length) parts.push(`It can be sent once the ${meta.waitingFor.join(' and ')} revision is in as well.`);
  else if (data.draft) parts.push(data.approvalRequired ? 'Another tuner or the owner approves it, then Send revision with a note of what changed.' : 'Use Send revision with a note of what changed.');
  if (meta.movedTo === 'ready') parts.push('The job is now Ready for a tuner.');
  if (meta.verification && meta.verification.status !== 'not_compared') parts.push(meta.verification.message);
  return parts.join(' ');
}

/** Upload one calibration file to a job, with a real progress bar and the server's reason when it refuses. */
export function FileUploadForm({ jobId, modules, canUploadRevision, jobOnBench }: { jobId: string; modules: CalibrationModule[]; canUploadRevision: boolean; jobOnBench: boolean }) {
  const [module, setModule] = useState<CalibrationModule>(modules[0] ?? 'ECM');
  // The kind follows the job (a revision while it is on the bench) until the user picks one that is still allowed.
  const [chosenKind, setKind] = useState<CalibrationFileKind | null>(null);
  const [notes, setNotes] = useState('');
  const [file, setFile] = useState<File | null>(null);
  const [progress, setProgress] = useState(0);
  const [missingFile, setMissingFile] = useState(false);
  const upload = useUploadJobFile();
  const kinds = KIND_OPTIONS.filter((option) => option.value !== 'revision' || canUploadRevision);
  const kind = chosenKind && kinds.some((option) => option.value === chosenKind) ? chosenKind : canUploadRevision && jobOnBench ? 'revision' : 'read';
  const kindHint = `${KIND_OPTIONS.find((option) => option.value === kind)?.hint ?? ''}${kind === 'revision' && !jobOnBench ? ' Revisions are taken while the job is On the bench: move it there first.' : ''}`;

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    setMissingFile(file === null);
    if (!file) return;
    setProgress(0);
    const form = event.currentTarget;
    upload.mutate(
      { jobId, file, module, kind, notes, onProgress: setProgress },
      {
        onSuccess: () => {
          setFile(null);
          setNotes('');
          form.reset();
        },
      },
    );
  };

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4" aria-label="Upload a calibration file">
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="file-module" label="Module">
          {(a11y) => <Select {...a11y} options={MODULE_OPTIONS} value={module} onChange={(e) => setModule(e.target.value as CalibrationModule)} />}
        </Field>
        <Field id="file-kind" label="Kind" hint={kindHint}>
          {(a11y) => <Select {...a11y} options={kinds} value={kind} onChange={(e) => setKind(e.target.value as CalibrationFileKind)} />}
        </Field>
      </div>
      <Field id="file-input" label="Calibration file" hint="Raw binary, Intel HEX or Motorola S-record." error={missingFile ? 'Choose the file to upload.' : undefined}>
        {(a11y) => (
          <input
            {...a11y}
            type="file"
            className="block w-full text-sm text-ink-800 file:mr-3 file:rounded-lg file:border file:border-ink-300 file:bg-white file:px-3 file:py-2 file:text-sm file:font-medium hover:file:bg-ink-100"
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              setMissingFile(false);
            }}
          />
        )}
      </Field>
      {kind === 'revision' && (
        <Field id="file-notes" label="Notes on this file (optional)">
          {(a11y) => <textarea {...a11y} rows={3} maxLength={2000} className={`${controlClasses} py-2`} value={notes} onChange={(e) => setNotes(e.target.value)} />}
        </Field>
      )}
      {upload.isPending && <ProgressBar label={`Uploading ${file?.name ?? 'file'}`} value={progress} />}
      {upload.isError && (
        <Banner tone="bad" title="The file was not stored">
          {errorMessage(upload.error)}
        </Banner>
      )}
      {upload.isSuccess && (
        <Banner tone={upload.data.meta.verification?.warning ? 'warn' : 'ok'} title="Upload complete">
          {outcomeText(upload.data)}
        </Banner>
      )}
      <div className="flex justify-end">
        <Button type="submit" pending={upload.isPending}>
          Upload file
        </Button>
      </div>
    </form>
  );
}
