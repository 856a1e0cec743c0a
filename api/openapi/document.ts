import { z } from 'zod';
// Registers the Problem schema that every error response references.
import '@shared/contracts/problem';
import type { Operation } from './operation';

type JsonSchema = Record<string, unknown>;

const schemaOptions = { io: 'input', unrepresentable: 'any', uri: (id: string) => `#/components/schemas/${id}` } as const;

function withoutDialect(schema: JsonSchema): JsonSchema {
  const { $schema: _dialect, $id: _id, ...rest } = schema;
  return rest;
}

/** A schema registered with `.meta({ id })` is referenced; any other is written inline. */
function schemaFor(schema: z.ZodType, components: Record<string, JsonSchema>): JsonSchema {
  const id = z.globalRegistry.get(schema)?.id;
  if (id && components[id]) return { $ref: `#/components/schemas/${id}` };
  const inline = z.toJSONSchema(schema, schemaOptions) as JsonSchema;
  const defs = inline['$defs'] as Record<string, JsonSchema> | undefined;
  if (defs) for (const [key, value] of Object.entries(defs)) components[key] ??= withoutDialect(value);
  const { $defs: _defs, ...rest } = withoutDialect(inline);
  return JSON.parse(JSON.stringify(rest).replaceAll('"#/$defs/', '"#/components/schemas/')) as JsonSchema;
}

/** A multipart/form-data body: the file as binary, every other field written out inline. */
function multipartBody(multipart: NonNullable<Operation['multipart']>, components: Record<string, JsonSchema>) {
  type ObjectSchema = JsonSchema & { properties?: Record<string, JsonSchema>; required?: string[] };
  const generated = z.toJSONSchema(multipart.fields, schemaOptions) as ObjectSchema;
  const defs = generated['$defs'] as Record<string, JsonSchema> | undefined;
  if (defs) for (const [key, value] of Object.entries(defs)) components[key] ??= withoutDialect(value);
  // A registered schema comes as a reference to its definition: the form needs its fields themselves.
  const ref = typeof generated['$ref'] === 'string' ? (generated['$ref'] as string) : '';
  const inline = (ref.startsWith('#/$defs/') ? defs?.[ref.slice('#/$defs/'.length)] : generated) as ObjectSchema;
  const fields = JSON.parse(JSON.stringify(inline.properties ?? {}).replaceAll('"#/$defs/', '"#/components/schemas/')) as Record<string, JsonSchema>;
  return {
    required: true,
    content: {
      'multipart/form-data': {
        schema: {
          type: 'object',
          required: [multipart.file, ...(inline.required ?? [])],
          properties: { [multipart.file]: { type: 'string', format: 'binary', description: multipart.fileDescription }, ...fields },
        },
        encoding: { [multipart.file]: { contentType: 'text/csv, text/plain, application/octet-stream' } },
      },
    },
  };
}

function security(access: Operation['access']) {
  return access === 'public' ? [] : [{ bearer: [] }, { cookie: [] }];
}

/** The OpenAPI 3.1 document, generated from the same zod schemas the routes validate with. */
export function buildOpenApiDocument(operations: Operation[], version: string): JsonSchema {
  const registered = z.toJSONSchema(z.globalRegistry, schemaOptions).schemas as Record<string, JsonSchema>;
  const components: Record<string, JsonSchema> = {};
  for (const [id, schema] of Object.entries(registered)) components[id] = withoutDialect(schema);

  const paths: Record<string, Record<string, unknown>> = {};
  for (const op of operations) {
    const parameters: unknown[] = (op.pathParameters ?? []).map((name) => ({ name, in: 'path', required: true, schema: { type: 'string' } }));
    if (op.query) {
      const query = schemaFor(op.query, components) as { properties?: Record<string, JsonSchema>; required?: string[] };
      for (const [name, schema] of Object.entries(query.properties ?? {})) {
        parameters.push({ name, in: 'query', required: query.required?.includes(name) ?? false, schema });
      }
    }
    const responses: Record<string, unknown> = {};
    for (const [status, response] of Object.entries(op.responses)) {
      const schema = response.schema ? schemaFor(response.schema, components) : Number(status) >= 400 ? { $ref: '#/components/schemas/Problem' } : undefined;
      responses[status] = {
        description: response.description,
        ...(schema ? { content: { [response.contentType ?? (Number(status) >= 400 ? 'application/problem+json' : 'application/json')]: { schema } } } : {}),
      };
    }
    if (op.access !== 'public') {
      responses['401'] ??= { description: 'Not signed in', content: { 'application/problem+json': { schema: { $ref: '#/components/schemas/Problem' } } } };
      if (Array.isArray(op.access)) responses['403'] ??= { description: 'Role not allowed', content: { 'application/problem+json': { schema: { $ref: '#/components/schemas/Problem' } } } };
    }
    paths[op.path] ??= {};
    paths[op.path]![op.method] = {
      summary: op.summary,
      tags: [op.tag],
      description: op.access === 'public' ? 'No sign-in needed.' : `Roles: ${op.access === 'any' ? 'any signed-in user' : op.access.join(', ')}.`,
      security: security(op.access),
      ...(parameters.length ? { parameters } : {}),
      ...(op.body ? { requestBody: { required: true, content: { 'application/json': { schema: schemaFor(op.body, components) } } } } : {}),
      ...(op.multipart ? { requestBody: multipartBody(op.multipart, components) } : {}),
      responses,
    };
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Quietbridge API',
      version,
      description:
        'Design, budget and review of capacitive-bridge sensor readout chains. All values in SI units. ' +
        'Browsers authenticate with the session cookie (state-changing requests also send X-CSRF-Token); scripts send Authorization: Bearer <token> from POST /api/auth/sign-in.',
    },
    servers: [{ url: '/' }],
    paths,
    components: {
      schemas: components,
      securitySchemes: {
        bearer: { type: 'http', scheme: 'bearer', bearerFormat: 'JWT' },
        cookie: { type: 'apiKey', in: 'cookie', name: 'qb_session' },
      },
    },
  };
}
