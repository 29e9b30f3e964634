/**
 * Newton's method failed for a reason the user's input decides (a start point
 * outside the basin, a period that is not the exact period of the result).
 * It is a UserError, so the command line prints it as one line and exits 2.
 */
import { UserError } from '../check/user-error.js';

export class NewtonError extends UserError {
  readonly detail: string;

  constructor(field: string, expected: string, received: unknown, detail: string) {
    super(field, expected, received);
    this.name = 'NewtonError';
    this.detail = detail;
    this.message = `${this.message} (${detail})`;
  }
}
