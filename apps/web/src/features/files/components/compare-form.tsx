import { useState } from 'react';
import type { CalibrationFile } from '@revloop/contract';
import { buttonClasses } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { Select } from '../../../components/ui/select';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';

/** Pick two files of one module and open their byte comparison. */
export function CompareForm({ jobId, files }: { jobId: string; files: CalibrationFile[] }) {
  const newest = files.at(-1);
  const sameModule = files.filter((f) => f.module === newest?.module);
  const [a, setA] = useState(sameModule.at(-2)?.id ?? '');
  const [b, setB] = useState(newest?.id ?? '');
  const options = files.map((f) => ({ value: f.id, label: `${f.label} — ${f.kind === 'revision' ? f.downloadName : f.originalName}` }));
  const moduleOf = (id: string) => files.find((f) => f.id === id)?.module;
  const mismatch = a && b && moduleOf(a) !== moduleOf(b);
  const ready = a && b && a !== b && !mismatch;
  return (
    <div className="flex flex-col gap-3 sm:flex-row sm:items-end">
      <div className="grid flex-1 gap-3 sm:grid-cols-2">
        <Field id="compare-a" label="Compare" error={mismatch ? 'Choose two files of the same module.' : undefined}>
          {(a11y) => <Select {...a11y} options={[{ value: '', label: 'Choose a file' }, ...options]} value={a} onChange={(e) => setA(e.target.value)} />}
        </Field>
        <Field id="compare-b" label="With">
          {(a11y) => <Select {...a11y} options={[{ value: '', label: 'Choose a file' }, ...options]} value={b} onChange={(e) => setB(e.target.value)} />}
        </Field>
      </div>
      {ready ? (
        <Link className={buttonClasses('secondary')} to={paths.fileDiff.getHref(jobId, a, b)}>
          Compare files
        </Link>
      ) : (
        <span className={buttonClasses('secondary', 'md', 'pointer-events-none opacity-60')} aria-disabled="true">
          Compare files
        </span>
      )}
    </div>
  );
}
