// The footage queues: checksum and probe of each received file (run in parallel; whichever
// finishes last settles the state), and the periodic sweep of expired uploads.
import type { Jobs } from '../../jobs/jobs.ts';
import { FOOTAGE_JOBS, type FootageService } from './footage.service.ts';

/** Defines the footage queues on `jobs`; workers start with jobs.startWorkers(). */
export function defineFootageJobs(jobs: Jobs, deps: { footage: FootageService; expiryMs: number; bytesOnDisk: (id: string) => Promise<number | null>; cleanupCron: string }) {
  const { footage } = deps;
  // Hashing a 256 GiB file takes minutes; probing is quick unless a container is damaged.
  jobs.define<{ footageId: string }>(FOOTAGE_JOBS.checksum, (d) => footage.computeChecksum(d.footageId), { queue: { retryLimit: 3, retryDelay: 10, expireInSeconds: 4 * 3600 }, concurrency: 4 });
  jobs.define<{ footageId: string }>(FOOTAGE_JOBS.probe, (d) => footage.probe(d.footageId), { queue: { retryLimit: 2, retryDelay: 10, expireInSeconds: 900 }, concurrency: 4 });
  jobs.define(FOOTAGE_JOBS.expire, async () => {
    const r = await footage.sweepUploads(deps.expiryMs, deps.bytesOnDisk);
    if (r.finished || r.expired || r.strays) console.log(`[uploads] sweep: ${r.finished} finished, ${r.expired} expired, ${r.strays} stray files removed`);
  }, { queue: { retryLimit: 0, expireInSeconds: 900 } });
  jobs.schedule(FOOTAGE_JOBS.expire, deps.cleanupCron);
}
