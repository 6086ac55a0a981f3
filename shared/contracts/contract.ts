// One entry per API route, written once and used by both sides: the server's ApiRouter registers
// the route from it (access policy, validation of params, query and body, the answer checked
// against its schema in tests and development) and the client's fetcher is built from it (the
// path, the body, the answer parsed in development and tests). See DEVELOPERS.md, "Contracts".
import type { z } from 'zod';
import { ROLES, type Role } from '../schemas/common';

export type Access = 'public' | 'signed-in' | readonly Role[];
export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/** Every role of the organisation's staff. */
export const STAFF = ROLES;
/** Those who test a venue: the technical director and the technicians. */
export const TESTERS = ['director', 'technician'] as const;
/** Those who keep the register and the limit profiles. */
export const KEEPERS = ['admin', 'director'] as const;

/** A multipart/form-data body: one file in the field `file`, and text fields checked by `fields`. */
export interface MultipartBody<F extends z.ZodType | undefined = z.ZodType | undefined> {
  readonly kind: 'multipart';
  readonly fields: F;
}
/**
 * A text body (a trace as CSV), up to maxBytes; `what` names it in the refusal of another type.
 * The server keeps it as bytes (it goes to a worker thread whole and is decoded there).
 */
export interface TextBody {
  readonly kind: 'text';
  readonly contentTypes: readonly string[];
  readonly maxBytes: number;
  readonly what: string;
}
/**
 * A text body as a handler gets it: bytes the server holds outside the event loop's heap until a
 * worker thread reads them (server/workers/parcel.ts).
 */
export interface ReceivedBytes {
  readonly byteLength: number;
}
/** A JSON body is its zod schema itself. */
export type BodySpec = z.ZodType | MultipartBody | TextBody;

export interface JsonAnswer<S extends z.ZodType = z.ZodType> {
  readonly kind: 'json';
  readonly schema: S;
  /** The success statuses; the first is the default. */
  readonly status: readonly number[];
}
export interface EmptyAnswer {
  readonly kind: 'empty';
}
/** A file (CSV, PDF, ZIP, a stored attachment): the route writes it itself, with one of these types. */
export interface FileAnswer {
  readonly kind: 'file';
  readonly contentTypes: readonly string[];
}
export type AnswerSpec = JsonAnswer | EmptyAnswer | FileAnswer;

export interface Contract {
  readonly method: Method;
  /** Express-style path under /api (or from the root with mount: 'root'), e.g. /venues/:id/board. */
  readonly path: string;
  readonly access: Access;
  readonly params?: z.ZodType;
  readonly query?: z.ZodType;
  readonly body?: BodySpec;
  readonly answer: AnswerSpec;
  readonly mount?: 'root';
  /**
   * The reading write: its answer is never checked on the server, so the hot path does exactly the
   * work it did before contracts; tests check its answers against the schema instead.
   */
  readonly hot?: true;
}

export const contract = <const C extends Contract>(c: C): C => c;

export const json = <S extends z.ZodType>(schema: S, ...status: number[]): JsonAnswer<S> => ({
  kind: 'json',
  schema,
  status: status.length > 0 ? status : [200],
});
export const noContent: EmptyAnswer = { kind: 'empty' };
export const file = (...contentTypes: string[]): FileAnswer => ({ kind: 'file', contentTypes });
export function multipart(): MultipartBody<undefined>;
export function multipart<F extends z.ZodType>(fields: F): MultipartBody<F>;
export function multipart(fields?: z.ZodType): MultipartBody {
  return { kind: 'multipart', fields };
}
export const textBody = (contentTypes: readonly string[], maxBytes: number, what: string): TextBody => ({
  kind: 'text',
  contentTypes,
  maxBytes,
  what,
});

/** How a route takes its body: JSON (a zod schema), a multipart form, text, or none. */
export function bodyKindOf(c: Contract): 'json' | 'multipart' | 'text' | 'none' {
  const b = c.body;
  if (b === undefined) return 'none';
  if (typeof b === 'object' && 'kind' in b && (b.kind === 'multipart' || b.kind === 'text')) return b.kind;
  return 'json';
}

/** The full path of a route as Express and app.routes list it. */
export const fullPath = (c: Contract) => (c.mount === 'root' ? c.path : `/api${c.path}`);

// ---------- types derived from a contract ----------

type ParamNames<P extends string> = P extends `${string}:${infer Name}/${infer Rest}`
  ? Name | ParamNames<`/${Rest}`>
  : P extends `${string}:${infer Name}`
    ? Name
    : never;

/** What the client puts in the path: the params schema's input, else the names in the path. */
export type ParamsIn<C extends Contract> = C extends { params: infer S extends z.ZodType }
  ? z.input<S>
  : Record<ParamNames<C['path']>, string>;
/** What the handler gets: the params schema's output, else the names in the path. */
export type ParamsOut<C extends Contract> = C extends { params: infer S extends z.ZodType }
  ? z.output<S>
  : Record<ParamNames<C['path']>, string>;
export type QueryIn<C extends Contract> = C extends { query: infer S extends z.ZodType } ? z.input<S> : undefined;
export type QueryOut<C extends Contract> = C extends { query: infer S extends z.ZodType } ? z.output<S> : undefined;

/** What the client sends: the JSON schema's input, a FormData, or the text (a Blob or string). */
export type BodyIn<C extends Contract> = C extends { body: infer B }
  ? B extends MultipartBody
    ? FormData
    : B extends TextBody
      ? Blob | string
      : B extends z.ZodType
        ? z.input<B>
        : undefined
  : undefined;
/** What the handler gets: the JSON schema's output, the parsed text fields of a form, or the text's bytes. */
export type BodyOut<C extends Contract> = C extends { body: infer B }
  ? B extends MultipartBody<infer F>
    ? F extends z.ZodType
      ? z.output<F>
      : undefined
    : B extends TextBody
      ? ReceivedBytes
      : B extends z.ZodType
        ? z.output<B>
        : undefined
  : undefined;

/** What the handler returns (the value sent as JSON), or nothing for an empty answer or a file. */
export type AnswerIn<C extends Contract> = C['answer'] extends JsonAnswer<infer S> ? z.input<S> : void;
/** What the client gets back. */
export type AnswerOf<C extends Contract> = C['answer'] extends JsonAnswer<infer S> ? z.output<S> : void;
