/**
 * Errors with a stable code. Logs and tests match the code (`error.code`), never the message, so a
 * message can be reworded without breaking an alert or a test. The cause, when there is one, is
 * kept for a debugger; it is never logged (it may carry a request body).
 */
export class SoluteError extends Error {
  constructor(
    readonly code: string,
    message: string,
    options?: { cause?: unknown },
  ) {
    super(message, options);
    this.name = new.target.name;
  }
}

/** The settings cannot start Solute: `config.invalid`. */
export class ConfigError extends SoluteError {
  constructor(message: string) {
    super("config.invalid", message);
  }
}

/** The store did not answer in time (`store.timeout`) or failed (`store.failed`). */
export class StoreError extends SoluteError {}
