/** Another browser tab already holds the device database (OPFS access handles are exclusive). */
export class DeviceDbLockedError extends Error {
  constructor(cause?: unknown) {
    super('Pivotwatch is open in another tab. Close it, then reload this one.');
    this.name = 'DeviceDbLockedError';
    this.cause = cause;
  }
}

/** The device database could not be opened or migrated for any other reason. */
export class DeviceDbOpenError extends Error {
  constructor(cause: unknown) {
    super(
      `The data on this device could not be opened: ${cause instanceof Error ? cause.message : String(cause)}`,
    );
    this.name = 'DeviceDbOpenError';
    this.cause = cause;
  }
}

/** Bad input to a repository: nothing was written. `issues` name the fields like the API's errors do. */
export class DeviceDataError extends Error {
  constructor(
    message: string,
    readonly issues: { path: string; message: string }[] = [],
  ) {
    super(message);
    this.name = 'DeviceDataError';
  }
}
