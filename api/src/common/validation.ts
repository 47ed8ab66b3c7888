import { Body, Param, ParseUUIDPipe, Query, type PipeTransform } from '@nestjs/common';
import { ApiBody, ApiParam, ApiQuery } from '@nestjs/swagger';
import { z } from 'zod';
import { invalid } from './errors.js';

/** JSON Schema of a zod shape for the OpenAPI document (the shapes live in @stavemark/shared). */
export function jsonSchemaOf(schema: z.ZodType): Record<string, unknown> {
  const { $schema: _drop, ...rest } = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as Record<
    string,
    unknown
  >;
  return rest;
}

/** Turns zod issues into the `details` list of the error shape: path and message per field. */
export function issuesToDetails(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((i) => ({
    path: i.path.length ? i.path.join('.') : '(body)',
    message: i.code === 'unrecognized_keys' ? `Unknown field(s): ${i.keys.join(', ')}` : i.message,
  }));
}

export class ZodValidationPipe<S extends z.ZodType> implements PipeTransform {
  constructor(
    private readonly schema: S,
    private readonly where: 'body' | 'query' = 'body',
  ) {}

  transform(value: unknown): z.infer<S> {
    const result = this.schema.safeParse(value ?? {});
    if (!result.success) {
      const details = issuesToDetails(result.error);
      const first = details[0];
      throw invalid(
        first ? `${first.path === '(body)' ? '' : `${first.path}: `}${first.message}` : `Invalid ${this.where}.`,
        details,
      );
    }
    return result.data;
  }
}

type ParamDecorator = (target: object, key: string | symbol | undefined, index: number) => void;

function methodDescriptor(target: object, key: string | symbol | undefined): PropertyDescriptor {
  const d = key === undefined ? undefined : Object.getOwnPropertyDescriptor(target, key);
  if (!d) throw new Error('Validation decorators go on controller method parameters');
  return d;
}

/** `@ValidBody(schema)`: validates the body with the shared zod shape and documents it. */
export function ValidBody(schema: z.ZodType): ParamDecorator {
  return (target, key, index) => {
    Body(new ZodValidationPipe(schema, 'body'))(target, key as string, index);
    ApiBody({ schema: jsonSchemaOf(schema) })(target, key as string, methodDescriptor(target, key));
  };
}

/** `@ValidQuery(schema)`: validates the query string and documents each parameter. */
export function ValidQuery(schema: z.ZodObject): ParamDecorator {
  return (target, key, index) => {
    Query(new ZodValidationPipe(schema, 'query'))(target, key as string, index);
    const d = methodDescriptor(target, key);
    const js = jsonSchemaOf(schema) as { properties?: Record<string, Record<string, unknown>>; required?: string[] };
    for (const [name, prop] of Object.entries(js.properties ?? {})) {
      ApiQuery({ name, required: js.required?.includes(name) ?? false, schema: prop })(target, key as string, d);
    }
  };
}

/** `@IdParam()`: a UUID path parameter; anything else answers 404 like a record that is not there. */
export function IdParam(name = 'id'): ParamDecorator {
  return (target, key, index) => {
    Param(
      name,
      new ParseUUIDPipe({
        exceptionFactory: () => invalid(`${name} must be an id (UUID).`, [{ path: name, message: 'not a UUID' }]),
      }),
    )(target, key as string, index);
    ApiParam({ name, format: 'uuid' })(target, key as string, methodDescriptor(target, key));
  };
}
