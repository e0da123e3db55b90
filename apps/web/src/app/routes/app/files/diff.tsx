import { useParams, useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { TextLink } from '../../../../components/ui/text-link';
import { paths } from '../../../../config/paths';
import { DiffView } from '../../../../features/files/components/diff-view';

export function FileDiffRoute() {
  const { jobId = '' } = useParams();
  const [search] = useSearchParams();
  const a = search.get('a') ?? '';
  const b = search.get('b') ?? '';
  return (
    <>
      <PageHeader title="Compare calibration files" description="Changed byte ranges between two images of the same module." actions={<TextLink to={paths.job.getHref(jobId)}>Back to the job</TextLink>} />
      {a && b ? <DiffView a={a} b={b} /> : <Banner tone="bad" title="Two files are needed">Choose two files on the job page to compare.</Banner>}
    </>
  );
}
