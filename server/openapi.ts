import { OpenAPIRegistry, OpenApiGeneratorV31 } from '@asteasolutions/zod-to-openapi';
import { errorBodySchema } from '../shared/schemas/error';

// Component names come from zod's own `.meta({ id })` on the shared schemas: the library's
// `.openapi()` prototype patch does not reach zod 4.6 schema instances.
export type ApiDocs = OpenAPIRegistry;

export function createRegistry(): OpenAPIRegistry {
  return new OpenAPIRegistry();
}

export function generateDocument(registry: OpenAPIRegistry, version: string) {
  // Every route shares the error body, so it is a component whether or not a path names it yet.
  const definitions = [
    ...registry.definitions,
    { type: 'schema' as const, schema: errorBodySchema },
  ];
  return new OpenApiGeneratorV31(definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Quenchbook API',
      version,
      description:
        'Soak recipes, batches, paired burn tests and treatment rankings. Errors share one body: ' +
        '{ error: { code, message, fields? } }.',
    },
    servers: [{ url: '/' }],
  });
}
