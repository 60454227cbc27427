// Reads the request schemas of the generated OpenAPI document (JSON Schema) next to a valid
// example, and lists every place a value sits with the rules that place has. Mutations are then
// chosen from what the document itself says is invalid, so a new field is covered without a
// test change.

export type JsonSchema = {
  $ref?: string;
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  enum?: unknown[];
  const?: unknown;
  oneOf?: JsonSchema[];
  anyOf?: JsonSchema[];
  allOf?: JsonSchema[];
  format?: string;
  pattern?: string;
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minItems?: number;
  maxItems?: number;
  default?: unknown;
};

export type OpenApiDocument = {
  paths: Record<string, Record<string, OpenApiOperation>>;
  components: { schemas: Record<string, JsonSchema> };
};

export type OpenApiOperation = {
  parameters?: { name: string; in: string; schema: JsonSchema; required?: boolean }[];
  requestBody?: { content: Record<string, { schema: JsonSchema }> };
};

export type JsonPath = (string | number)[];

export type Slot = {
  path: JsonPath;
  schema: JsonSchema;
  /** Leaving it out makes the request invalid. */
  required: boolean;
  value: unknown;
};

export type JsonType = 'string' | 'number' | 'integer' | 'boolean' | 'null' | 'array' | 'object';

export function resolve(doc: OpenApiDocument, schema: JsonSchema): JsonSchema {
  let s = schema;
  while (s.$ref) {
    const name = s.$ref.replace('#/components/schemas/', '');
    const target = doc.components.schemas[name];
    if (!target) throw new Error(`Unresolved ${s.$ref}`);
    s = target;
  }
  if (s.allOf) {
    return s.allOf
      .map((part) => resolve(doc, part))
      .reduce<JsonSchema>(
        (acc, part) => ({
          ...acc,
          ...part,
          properties: { ...acc.properties, ...part.properties },
          required: [...(acc.required ?? []), ...(part.required ?? [])],
        }),
        {},
      );
  }
  return s;
}

function typeOf(value: unknown): JsonType {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'array';
  if (typeof value === 'number') return Number.isInteger(value) ? 'integer' : 'number';
  return typeof value as JsonType;
}

/** The branch of a oneOf / anyOf that the example value takes (by its fixed-value fields). */
function branchFor(doc: OpenApiDocument, schema: JsonSchema, value: unknown): JsonSchema {
  const branches = schema.oneOf ?? schema.anyOf;
  if (!branches) return schema;
  const resolved = branches.map((b) => resolve(doc, b));
  const fits = resolved.find((b) => {
    if (!allowedTypes(doc, b).has(typeOf(value))) return false;
    if (typeof value !== 'object' || value === null || !b.properties) return true;
    return Object.entries(b.properties).every(([key, p]) => {
      const fixed = p.enum ?? (p.const !== undefined ? [p.const] : undefined);
      return !fixed || fixed.includes((value as Record<string, unknown>)[key]);
    });
  });
  if (!fits) throw new Error(`The example ${JSON.stringify(value)} fits no branch`);
  return fits;
}

/** JSON types a value may have here; an empty set means anything goes. */
export function allowedTypes(doc: OpenApiDocument, schema: JsonSchema): Set<JsonType> {
  const s = resolve(doc, schema);
  const branches = s.oneOf ?? s.anyOf;
  if (branches) return new Set(branches.flatMap((b) => [...allowedTypes(doc, b)]));
  const fixed = s.enum ?? (s.const !== undefined ? [s.const] : undefined);
  if (fixed)
    return new Set(fixed.map(typeOf).flatMap((t) => (t === 'integer' ? [t, 'number'] : [t])));
  const types = s.type === undefined ? [] : Array.isArray(s.type) ? s.type : [s.type];
  const set = new Set(types as JsonType[]);
  // A whole number is a number too; a number slot takes integers.
  if (set.has('number')) set.add('integer');
  return set;
}

/** Every value in the example, depth first, with the schema that governs it. */
export function slotsOf(doc: OpenApiDocument, root: JsonSchema, example: unknown): Slot[] {
  const slots: Slot[] = [];
  const walk = (schema: JsonSchema, value: unknown, path: JsonPath) => {
    const s = branchFor(doc, resolve(doc, schema), value);
    if (Array.isArray(value) && s.items) {
      value.forEach((item, i) => {
        slots.push({ path: [...path, i], schema: s.items!, required: false, value: item });
        walk(s.items!, item, [...path, i]);
      });
    } else if (value && typeof value === 'object' && s.properties) {
      for (const [key, item] of Object.entries(value)) {
        const child = s.properties[key];
        if (!child) throw new Error(`The example has ${[...path, key].join('.')}, the schema not`);
        const required = (s.required ?? []).includes(key) && child.default === undefined;
        slots.push({ path: [...path, key], schema: child, required, value: item });
        walk(child, item, [...path, key]);
      }
    }
  };
  walk(root, example, []);
  return slots;
}

/** The object schema at a path of the example (for adding a field it does not know). */
export function objectSchemaAt(
  doc: OpenApiDocument,
  root: JsonSchema,
  example: unknown,
  path: JsonPath,
): JsonSchema {
  let schema = branchFor(doc, resolve(doc, root), example);
  let value = example;
  for (const step of path) {
    value = (value as Record<string | number, unknown>)[step];
    const next = typeof step === 'number' ? schema.items! : schema.properties![step]!;
    schema = branchFor(doc, resolve(doc, next), value);
  }
  return schema;
}

export function getAt(value: unknown, path: JsonPath): unknown {
  return path.reduce<unknown>((v, step) => (v as Record<string | number, unknown>)[step], value);
}

/** A deep copy with the value at `path` replaced, or removed when `next` is `REMOVE`. */
export const REMOVE = Symbol('remove');
export function setAt(value: unknown, path: JsonPath, next: unknown): unknown {
  if (path.length === 0) return next;
  const [step, ...rest] = path;
  const copy: Record<string | number, unknown> | unknown[] = Array.isArray(value)
    ? [...value]
    : { ...(value as Record<string, unknown>) };
  const inner = setAt((copy as Record<string | number, unknown>)[step!], rest, next);
  if (inner === REMOVE) {
    if (Array.isArray(copy)) copy.splice(step as number, 1);
    else delete (copy as Record<string | number, unknown>)[step!];
  } else {
    // defineProperty, not assignment: a key such as "__proto__" must become a real field.
    Object.defineProperty(copy, step!, {
      value: inner,
      enumerable: true,
      writable: true,
      configurable: true,
    });
  }
  return copy;
}
