import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageHeader } from '../../../components/layout/page-header';

export type PlaceholderKind = 'jobs' | 'my-jobs' | 'vehicles' | 'customers';

const COPY: Record<PlaceholderKind, { title: string; description: string; coming: string[] }> = {
  jobs: {
    title: 'Jobs',
    description: "Every vehicle's calibration work, from the stock read to dialed in.",
    coming: [
      'A board of jobs by state: Intake, Ready, On the bench, With customer, Log review, Dialed in.',
      'For each job: the vehicle, the package, the reads and revisions per module (ECM, TCM), and the log reviews.',
      'Messages between the shop, the dealer and the vehicle owner.',
    ],
  },
  'my-jobs': {
    title: 'My jobs',
    description: 'Your vehicles with the shop: what to upload, what to flash and what to log next.',
    coming: [
      'Upload the stock read of your car, and later the datalogs the tuner asks for.',
      'Download each revision with its flashing notes.',
      'Messages with your tuner and the state of each job.',
    ],
  },
  vehicles: {
    title: 'Vehicles',
    description: 'The cars you have with the shop.',
    coming: ['VIN, model year, engine, transmission, tyre size and modifications of each vehicle.', 'The jobs opened for each vehicle.'],
  },
  customers: {
    title: 'Customers',
    description: 'The people you sell tunes to through the shop.',
    coming: ['Your customers with their vehicles and jobs.', 'Open a job for a customer and upload reads and logs on their behalf.'],
  },
};

/** Stands in for screens a later feature builds; it says what will be here and shows no invented data. */
export function JobsPlaceholder({ kind }: { kind: PlaceholderKind }) {
  const copy = COPY[kind];
  return (
    <>
      <PageHeader title={copy.title} description={copy.description} />
      <Card>
        <EmptyState title="This screen is being built">
          <p>It will show:</p>
          <ul className="mt-2 list-disc space-y-1 pl-5 text-left">
            {copy.coming.map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
        </EmptyState>
      </Card>
    </>
  );
}
