import { CALIBRATION_MODULES } from '@revloop/contract';
import { Banner } from '../../../components/ui/banner';
import { Card } from '../../../components/ui/card';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useJobFiles } from '../api/get-job-files';
import { CompareForm } from './compare-form';
import { FileUploadForm } from './file-upload-form';
import { FilesTable, NoFilesYet } from './files-table';
import { FlashCautions } from './flash-cautions';

/** The subset of the API job (`GET /api/jobs/:id`) the files panel reads. */
export interface FilesPanelJob {
  state: string;
  round: number;
  customer: { name: string };
  vehicle: { description: string };
  package: { name: string };
}

/** Calibration files of one job: uploads, reads, revisions, proof of what is on the car, and comparisons. */
export function JobFilesPanel({ jobId, job }: { jobId: string; job: FilesPanelJob }) {
  const files = useJobFiles(jobId);
  const list = files.data?.data ?? [];
  const meta = files.data?.meta;
  const hasRevision = list.some((f) => f.kind === 'revision');
  const modules = [...new Set([...list.map((f) => f.module), ...CALIBRATION_MODULES])];
  return (
    <Card title="Calibration files" description={`${job.package.name} · ${job.round === 0 ? 'no revision sent yet' : `revision ${job.round} sent`}`}>
      <div className="flex flex-col gap-5">
        {files.isPending && <Spinner label="Loading the files" />}
        {files.isError && <Banner tone="bad" title="The files could not be loaded">{errorMessage(files.error)}</Banner>}
        {files.isSuccess && (list.length ? <FilesTable files={list} canVerify={meta?.canVerify ?? false} /> : <NoFilesYet canUpload={meta?.canUpload ?? false} />)}
        {hasRevision && <FlashCautions />}
        {list.length >= 2 && (
          <section aria-label="Compare two files" className="border-t border-ink-100 pt-4">
            <CompareForm jobId={jobId} files={list} />
          </section>
        )}
        {meta?.canUpload && job.state !== 'cancelled' && (
          <section aria-label="Upload" className="border-t border-ink-100 pt-4">
            <h3 className="mb-3 text-sm font-semibold text-ink-900">Upload a file</h3>
            <FileUploadForm jobId={jobId} modules={modules} canUploadRevision={meta.canUploadRevision} jobOnBench={job.state === 'on_bench'} />
          </section>
        )}
      </div>
    </Card>
  );
}
