type BatchJob = { id: string; data: unknown };

/**
 * Runs a fetched batch one job after another. A job that throws is failed on its own (pg-boss retries
 * it); the others are completed when the batch returns, since pg-boss completes only active jobs.
 */
export async function runBatch(
  jobs: BatchJob[],
  handler: (data: unknown, id: string) => Promise<unknown>,
  fail: (id: string, error: { message: string }) => Promise<unknown>,
) {
  for (const job of jobs) {
    try {
      await handler(job.data, job.id);
    } catch (error) {
      await fail(job.id, { message: error instanceof Error ? error.message : String(error) });
    }
  }
}
