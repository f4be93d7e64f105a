/** Makes a switch fail to compile when a case is missing. */
export function assertUnreachable(value: never): never {
  throw new Error(`Unexpected value: ${String(value)}`);
}
