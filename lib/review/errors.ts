/**
 * Errors particular to the review path. They extend the shared DomainError
 * family (lib/errors.ts), so the edges' one error helper maps them to 403/409
 * without knowing about review.
 */
import { ConflictError, ForbiddenError } from "../errors";

/** Four-eyes rule: the member who uploaded a revision may not review, pass or clear it (403). */
export class FourEyesError extends ForbiddenError {
  override readonly code: string = "four_eyes";

  constructor(message = "You uploaded this revision, so someone else must review it (four-eyes rule).") {
    super(message);
  }
}

/** The re-entered password did not verify, so the clearance signature is refused (403). */
export class SignatureError extends ForbiddenError {
  override readonly code: string = "signature_not_verified";

  constructor(message = "Clearing for tape-out is a signature: re-enter your password correctly to sign.") {
    super(message);
  }
}

/**
 * Someone else changed the review since the caller loaded it. The machine throws
 * it for a stale `expectedVersion`; the service throws the same error when its
 * compare-and-set update (`UPDATE … WHERE version = ?`) touches no row.
 */
export class StaleVersionError extends ConflictError {
  constructor(expectedVersion: number, currentVersion?: number) {
    super(
      "stale_version",
      "Someone else acted on this revision's review since you loaded it; reload the page to see the change, then try again.",
      { expectedVersion, ...(currentVersion === undefined ? {} : { currentVersion }) },
    );
  }
}
