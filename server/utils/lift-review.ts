// The server's lift checks for the review screens and the job page (see lift-review-sql.ts).
import type { ReviewedLift } from '../../shared/types/rollup'
import { checkedLifts } from './lift-review-sql'

/** The checked lifts of the given day sheets (the caller has checked the member may see them). */
export async function liftChecksFor(dayIds: readonly string[]): Promise<ReviewedLift[]> {
  return await checkedLifts(useDb(), { dayIds })
}

/** Every checked lift of a job, oldest first. */
export async function liftChecksForJob(jobId: string): Promise<ReviewedLift[]> {
  return await checkedLifts(useDb(), { jobId })
}
