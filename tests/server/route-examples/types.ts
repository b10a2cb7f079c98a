import type { TestApp } from '../helpers';

/** A request that the allowed roles should see succeed; made afresh for each role. */
export type ExampleRequest = {
  path: string;
  body?: unknown;
  /** Multipart upload instead of JSON: field name -> file content, plus text fields. */
  files?: Record<string, { content: Buffer; filename: string; contentType?: string }>;
  fields?: Record<string, string>;
  /** The success status if not any 2xx (e.g. 202). */
  okStatus?: number;
};

/** Keyed by `METHOD /path` exactly as the route table declares it. */
export type RouteExamples = Record<string, (t: TestApp, role: string) => ExampleRequest | Promise<ExampleRequest>>;
