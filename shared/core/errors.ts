// Typed errors of the measurement core. The core throws these instead of returning NaN.

export type DecodeErrorCode =
  | 'unknown_probe'
  | 'unknown_gain'
  | 'counts_out_of_range'
  | 'counts_not_integer'
  | 'bad_integration_time'
  | 'bad_temperature'
  | 'bad_time'
  | 'no_coefficient_set'
  | 'bad_signal'
  | 'bad_probe'
  | 'bad_input'
  | 'insufficient_data';

export class DecodeError extends Error {
  readonly code: DecodeErrorCode;
  /** Extra context for the caller (e.g. the offending value). */
  readonly detail: Readonly<Record<string, unknown>>;

  constructor(code: DecodeErrorCode, message: string, detail: Record<string, unknown> = {}) {
    super(message);
    this.name = 'DecodeError';
    this.code = code;
    this.detail = detail;
  }
}

export function isDecodeError(e: unknown): e is DecodeError {
  return e instanceof DecodeError;
}
