// The public entry of the jobs feature: what other features may use (lint forbids reaching past it).
export { usePhotoJobs, useRetryJob } from './api';
