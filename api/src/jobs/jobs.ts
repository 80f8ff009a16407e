// Background jobs on PostgreSQL (pg-boss), so workers can run in any API process or on other
// machines. Modules `define` their queues and handlers once; the server (and tests that need
// workers) call `startWorkers()`; anyone may `send`. pg-boss 10: a queue must exist
// (createQueue) before send/work, and work handlers receive an array of jobs.
import PgBoss from 'pg-boss';

/** Handles one job's data; throw to let pg-boss retry it (up to the queue's retry limit). */
export type JobHandler<T extends object> = (data: T, job: PgBoss.Job<T>) => Promise<void>;

interface Definition {
  name: string;
  queue: Omit<PgBoss.Queue, 'name'>;
  work: PgBoss.WorkOptions;
  /** Jobs one worker runs at once (fetched as one batch, each completed or failed on its own). */
  concurrency: number;
  handler: JobHandler<any>;
}

export interface JobsOptions {
  /** pg-boss schema (default "pgboss"). */
  schema?: string;
  /** Seconds between polls for new jobs when nothing notified the worker (default 2). */
  pollingIntervalSeconds?: number;
}

/** The job queue of one process: queue definitions, a lazily started pg-boss, its workers. */
export class Jobs {
  readonly boss: PgBoss;
  private starting: Promise<void> | null = null;
  private stopped = false;
  private readonly definitions = new Map<string, Definition>();
  private readonly created = new Set<string>();
  private readonly workerIds = new Map<string, string>();
  private readonly schedules: { name: string; cron: string; data: object }[] = [];
  private readonly polling: number;

  constructor(connectionString: string, opts: JobsOptions = {}) {
    this.polling = opts.pollingIntervalSeconds ?? 2;
    this.boss = new PgBoss({ connectionString, schema: opts.schema ?? 'pgboss', max: 4, application_name: 'midgray-jobs' });
    this.boss.on('error', (err) => console.error('[jobs]', err));
  }

  /** Starts pg-boss once (creates its schema on first use); later calls return the same promise. */
  start(): Promise<void> {
    if (this.stopped) return Promise.reject(new Error('the job queue was stopped'));
    this.starting ??= this.boss.start().then(() => undefined);
    return this.starting;
  }

  /** Declares a queue and its handler; workers run only after startWorkers(). */
  define<T extends object>(name: string, handler: JobHandler<T>, opts: { queue?: Omit<PgBoss.Queue, 'name'>; work?: PgBoss.WorkOptions; concurrency?: number } = {}) {
    this.definitions.set(name, { name, handler, queue: opts.queue ?? { retryLimit: 3, retryDelay: 5, expireInSeconds: 3600 }, work: opts.work ?? {}, concurrency: opts.concurrency ?? 1 });
  }

  /** Declares a cron schedule (pg-boss runs it once per slot across all processes) for a defined queue. */
  schedule(name: string, cron: string, data: object = {}) {
    this.schedules.push({ name, cron, data });
  }

  private async ensureQueue(name: string) {
    await this.start();
    if (this.created.has(name)) return;
    await this.boss.createQueue(name, { name, ...(this.definitions.get(name)?.queue ?? {}) });
    this.created.add(name);
  }

  /** Queues a job; returns its id. A worker of this process, if any, is woken at once. */
  async send(name: string, data: object, options: PgBoss.SendOptions = {}): Promise<string | null> {
    await this.ensureQueue(name);
    const id = await this.boss.send(name, data, options);
    const worker = this.workerIds.get(name);
    if (worker) this.boss.notifyWorker(worker);
    return id;
  }

  /** Wakes this process's workers of these queues (after a transaction that queued jobs committed). */
  wake(...names: string[]) {
    for (const name of names) {
      const worker = this.workerIds.get(name);
      if (worker) this.boss.notifyWorker(worker);
    }
  }

  /** Starts a worker for every defined queue and registers the schedules. Idempotent. */
  async startWorkers(): Promise<void> {
    for (const d of this.definitions.values()) {
      if (this.workerIds.has(d.name)) continue;
      await this.ensureQueue(d.name);
      const id = await this.boss.work(d.name, { batchSize: d.concurrency, pollingIntervalSeconds: this.polling, ...d.work }, async (jobs: PgBoss.Job<object>[]) => {
        const results = await Promise.allSettled(jobs.map((job) => d.handler(job.data, job)));
        // pg-boss completes the whole batch when this returns; failed ones are failed first (and retried).
        for (const [i, r] of results.entries()) {
          if (r.status === 'rejected') {
            console.error(`[jobs] ${d.name} ${jobs[i].id} failed:`, r.reason);
            await this.boss.fail(d.name, jobs[i].id, { message: String((r.reason as Error)?.message ?? r.reason) });
          }
        }
        // A worker waits its polling interval after each batch; when there was work, look again at once.
        if (jobs.length) this.boss.notifyWorker(this.workerIds.get(d.name)!);
      });
      this.workerIds.set(d.name, id);
    }
    for (const s of this.schedules) {
      await this.ensureQueue(s.name);
      await this.boss.schedule(s.name, s.cron, s.data);
    }
  }

  /** Stops workers (waiting for running jobs up to `timeoutMs`) and closes pg-boss's pool. */
  async stop(timeoutMs = 10_000): Promise<void> {
    if (this.stopped) return;
    this.stopped = true;
    if (!this.starting) return;
    await this.starting.catch(() => undefined);
    await this.boss.stop({ graceful: true, wait: true, timeout: timeoutMs });
  }
}
