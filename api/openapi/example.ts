import type { ExampleObject } from 'openapi3-ts/oas31';

/** The extension naming the status an example request yields; the replay test checks it. */
export const EXPECTED_STATUS = 'x-expected-status';

/**
 * An Example Object for a request body or a parameter. Examples of one operation that share a
 * key form one request; `x-expected-status` says which documented response it gets.
 */
export function example(summary: string, value: unknown, expectedStatus: number): ExampleObject {
  return { summary, value, [EXPECTED_STATUS]: expectedStatus };
}
