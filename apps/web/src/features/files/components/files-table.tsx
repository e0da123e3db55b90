import { useState } from 'react';
import type { CalibrationFile } from '@revloop/contract';
import { Badge } from '../../../components/ui/badge';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { ProgressBar } from '../../datalogs/components/progress-bar';
import { Link, useNavigate } from 'react-router-dom';
import { buttonClasses } from '../../../components/ui/button';
import { paths } from '../../../config/paths';
import { useApproveFile } from '../api/approve-file';
import { useDownloadFile } from '../api/download-file';
import { useStartCheckout } from '../../billing/api/start-checkout';
import { useFileVerification } from '../api/get-file-verification';
import { formatBytes } from './file-format';
import { VerifyResult } from './verify-result';
import { ScrollRegion } from '../../../components/ui/scroll-region';

const KIND_TONE = { read: 'neutral', re_read: 'accent', revision: 'ok' } as const;

/** A sent revision locked until the job is paid: why, what is due, and the Pay button (the job's own Checkout). */
function LockedDownload({ file }: { file: CalibrationFile }) {
  const checkout = useStartCheckout();
  return (
    <div className="flex max-w-md flex-col gap-2 rounded border border-warn/40 bg-warn/5 p-2" role="group" aria-label={`${file.label} locked until paid`}>
      <p className="text-sm text-ink-800">{file.lock.message}</p>
      <div>
        <Button size="sm" onClick={() => checkout.mutate({ purpose: 'job', jobId: file.jobId })} pending={checkout.isPending || checkout.isSuccess}>
          Pay to unlock
        </Button>
      </div>
      {checkout.isError && (
        <p role="alert" className="text-xs text-bad">
          {errorMessage(checkout.error)}
        </p>
      )}
    </div>
  );
}

function DownloadButton({ file }: { file: CalibrationFile }) {
  const [progress, setProgress] = useState(0);
  const download = useDownloadFile();
  return (
    <div className="flex min-w-32 flex-col gap-1">
      <Button
        size="sm"
        variant="secondary"
        pending={download.isPending}
        aria-label={`Download ${file.label}`}
        onClick={() => {
          setProgress(0);
          download.mutate({ file, onProgress: setProgress });
        }}
      >
        Download
      </Button>
      {download.isPending && <ProgressBar label={`Downloading ${file.downloadName}`} value={progress} />}
      {download.isError && <p className="text-xs text-bad">{errorMessage(download.error)}</p>}
    </div>
  );
}

/** A draft's review: its approval state, Approve when this viewer may, and the diff against the file it was made from. */
function DraftReview({ file }: { file: CalibrationFile }) {
  const approve = useApproveFile();
  const navigate = useNavigate();
  return (
    <div className="mt-2 flex flex-wrap items-center gap-2">
      {file.parentFileId && (
        <Link className={buttonClasses('secondary', 'sm')} to={paths.fileDiff.getHref(file.jobId, file.parentFileId, file.id)} aria-label={`Diff ${file.label} against previous`}>
          Diff against previous
        </Link>
      )}
      {file.canApprove && (
        <Button size="sm" pending={approve.isPending} onClick={() => approve.mutate(file.id, { onSuccess: (r) => !r.meta.jobInReach && navigate(`${paths.jobs.getHref()}?awaiting=approval`) })} aria-label={`Approve ${file.label}`}>
          Approve
        </Button>
      )}
      {approve.isError && (
        <p role="alert" className="text-xs text-bad">
          {errorMessage(approve.error)}
        </p>
      )}
    </div>
  );
}

function ReviewBadges({ file }: { file: CalibrationFile }) {
  if (!file.draft) return null;
  return (
    <>
      <Badge tone="warn">Draft, not sent</Badge>
      {file.approvalRequired && !file.approvedBy && <Badge tone="warn">Awaiting approval</Badge>}
      {file.approvedBy && <Badge tone="ok">Approved by {file.approvedBy.name}</Badge>}
    </>
  );
}

/** The job's files, oldest first, with what proves each one: format, sizes, CRC-32 of the image, SHA-256 of the file. */
export function FilesTable({ files, canVerify }: { files: CalibrationFile[]; canVerify: boolean }) {
  // Reads and re-reads are checked as soon as the shop opens the list; a clean read stays quiet.
  const [toggled, setToggled] = useState<Record<string, boolean>>({});
  return (
    <ScrollRegion label="Files">
      <table className="w-full min-w-[34rem] text-left text-sm">
        <thead className="border-b border-ink-200 text-xs text-ink-600 uppercase">
          <tr>
            <th scope="col" className="py-2 pr-3 font-medium">File</th>
            <th scope="col" className="py-2 pr-3 font-medium">Format and size</th>
            <th scope="col" className="py-2 pr-3 font-medium">CRC-32 / SHA-256</th>
            <th scope="col" className="py-2 font-medium">Uploaded</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {files.map((file) => (
            <FileRow
              key={file.id}
              file={file}
              canVerify={canVerify && file.kind !== 'revision'}
              chosen={toggled[file.id]}
              onCheck={(shown) => setToggled({ ...toggled, [file.id]: !shown })}
            />
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  );
}

function FileRow({ file, canVerify, chosen, onCheck }: { file: CalibrationFile; canVerify: boolean; chosen: boolean | undefined; onCheck: (shown: boolean) => void }) {
  const check = useFileVerification(file.id, canVerify);
  // Until the user chooses, a re-read's check shows and a read's shows only when it warns; the row never opens empty.
  const shown = canVerify && (chosen ?? (file.kind !== 'read' || check.data?.data.warning === true));
  return (
    <>
      <tr className="align-top">
        <td className="py-3 pr-3">
          <div className="flex flex-wrap items-center gap-2">
            <Badge tone={KIND_TONE[file.kind]}>{file.label}</Badge>
            {file.plausibility?.status === 'unexpected_size' && <Badge tone="warn">Unexpected size</Badge>}
            <ReviewBadges file={file} />
            {file.lock.locked && <Badge tone="warn">Locked until paid</Badge>}
          </div>
          {file.plausibility?.status === 'unexpected_size' && <p className="mt-1 text-warn">{file.plausibility.message}</p>}
          <p className="mt-1 break-all text-ink-700">{file.kind === 'revision' ? file.downloadName : file.originalName}</p>
          {file.notes && <p className="mt-1 text-ink-600">{file.notes}</p>}
          {file.sendNote && (
            <p className="mt-1 rounded bg-accent-50 px-2 py-1 text-ink-800">
              <span className="font-medium">What changed: </span>
              {file.sendNote}
            </p>
          )}
          {file.draft && <DraftReview file={file} />}
          <div className="mt-2 flex flex-wrap items-start gap-2">
            {file.lock.locked ? <LockedDownload file={file} /> : <DownloadButton file={file} />}
            {canVerify && (
              <Button size="sm" variant="ghost" aria-expanded={shown} aria-controls={`check-${file.id}`} onClick={() => onCheck(shown)}>
                {shown ? 'Hide check' : 'Show check'}
              </Button>
            )}
          </div>
        </td>
        <td className="py-3 pr-3 text-ink-700">
          <p>{file.formatLabel}</p>
          <p className="text-xs text-ink-600">
            {formatBytes(file.imageBytes)} data · {formatBytes(file.sizeBytes)} file
          </p>
        </td>
        <td className="py-3 pr-3 font-mono text-xs text-ink-800">
          <p>{file.crc32Hex}</p>
          <p title={file.sha256}>{file.sha256.slice(0, 12)}…</p>
        </td>
        <td className="py-3 text-ink-700">
          <p>{file.uploadedBy.name}</p>
          <p className="text-xs text-ink-600">{formatDateTime(file.createdAt)}</p>
        </td>
      </tr>
      {shown && (
        <tr id={`check-${file.id}`}>
          <td colSpan={4} className="pb-3">
            <VerifyResult fileId={file.id} />
          </td>
        </tr>
      )}
    </>
  );
}

export function NoFilesYet({ canUpload }: { canUpload: boolean }) {
  return <Banner tone="neutral">{canUpload ? 'No files yet. Upload the stock read to start the job.' : 'No files you can see yet.'}</Banner>;
}
