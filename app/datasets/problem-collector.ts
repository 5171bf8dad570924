import type { DatasetProblem } from "./dataset-problem";

/** How many problems a response lists; the total count is always reported beside them. */
export const MAX_LISTED_PROBLEMS = 100;

/**
 * Keeps the first problems in file order and counts all of them, so that a file with a
 * million bad rows costs no more memory than one with a hundred.
 */
export class ProblemCollector {
  readonly problems: DatasetProblem[] = [];
  count = 0;

  constructor(private readonly limit = MAX_LISTED_PROBLEMS) {}

  add(problem: DatasetProblem): void {
    this.count++;
    if (this.problems.length < this.limit) this.problems.push(problem);
  }

  get isEmpty(): boolean {
    return this.count === 0;
  }
}
