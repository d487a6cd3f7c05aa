/** Prints a usage or input problem and exits with status 2 (bad invocation), as the CLIs share. */
export function fail(message: string): never {
  console.error(message);
  process.exit(2);
}
