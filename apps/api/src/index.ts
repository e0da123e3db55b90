// The API's public entry: the only API code other workspaces (the demo seeds) may import. Seeds write through the
// same services the routes use, so the demo's rows, audit events and notices are the ones real use would leave.
export { loadEnv, type Env } from './env';
export { DiskBlobStore, type BlobStore } from './storage/blob-store';
export { S3BlobStore } from './storage/s3-blob-store';
export { hashPassword } from './features/auth/password';
export { buildActor } from './http/auth-context';
export { recordAudit } from './features/audit/audit.service';
export { moveJob, setJobFacts, takeJob, type JobFlowDeps } from './features/jobs/job-workflow.service';
export { postJobMessage } from './features/jobs/job-messages.service';
export { fileLabel } from './features/files/file.presenter';
export { datalogVehicleOf, type ShopAuth } from './features/datalogs/datalog.service';
export { blobStoreOf } from './storage/blob-store-of';
