/** A mistake in how the command was called: exit status 2. */
export class UsageError extends Error {}
