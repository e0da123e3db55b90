// What other features (files, datalogs, billing) and the demo seeds use of jobs, in one import: each piece lives in
// its role's file (presenter, lookup, intake, workflow, messages, timeline).
export { factsOf, jobRowToJob, jobSubject, type ApiJob } from './job.presenter';
export { customerSideOf, jobLink, loadJob, shopSideOf } from './job-lookup.service';
export { FLASH_CAUTIONS } from './job-notices';
export { moveJob, setJobFacts, takeJob, transitionJob, type JobFlowDeps, type Mover } from './job-workflow.service';
export { postJobMessage } from './job-messages.service';
