/** For exhaustive switches: a missing case becomes a compile error here. */
export function assertUnreachable(value: never): never {
  throw new Error(`Unhandled case: ${String(value)}`);
}
