/**
 * Errors the domain raises. The api's global filter maps them to HTTP:
 * ValidationError → 400 (details name each field), QuotaError → 429, NotFoundError → 404,
 * ConflictError → 409, TooLargeError → 413. Anything else is a 500 with no internals.
 */
export interface ErrorDetail {
  /** Field path, dot-separated (`axes.0.min`, `inputs.Te_eV`). */
  path: string;
  /** The field as the form labels it ("T_e axis · From", "Name"); shown with the message instead of the path. */
  label?: string;
  /** A phrase that completes the label: "must be greater than 0". */
  message: string;
  line?: number;
  column?: string;
}

export class DomainError extends Error {
  constructor(
    message: string,
    readonly details?: ErrorDetail[],
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class ValidationError extends DomainError {}
export class NotFoundError extends DomainError {}
export class ConflictError extends DomainError {}
export class QuotaError extends DomainError {}
export class TooLargeError extends DomainError {}
export class ForbiddenError extends DomainError {}
