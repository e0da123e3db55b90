import { Card } from '../../../components/ui/card';

/** The subset of the API job (`GET /api/jobs/:id`) the files panel reads. */
export interface FilesPanelJob {
  state: string;
  round: number;
  customer: { name: string };
  vehicle: { description: string };
  package: { name: string };
}

/** Calibration files of one job: uploads, reads, revisions, proof and diffs. */
export function JobFilesPanel({ jobId, job }: { jobId: string; job: FilesPanelJob }) {
  return (
    <Card title="Calibration files" description={`${job.package.name} · round ${job.round}`}>
      <p className="text-sm text-ink-600" data-job-id={jobId}>
        Files load here.
      </p>
    </Card>
  );
}
