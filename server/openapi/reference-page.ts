/**
 * The API reference for people: one plain HTML page rendered from the OpenAPI document, so the
 * page and the document always agree. No scripts and nothing fetched from elsewhere.
 */
import { ACCESS_EXTENSION, inWords, type OpenApiDocument, type OperationAccess } from './openapi-document.js';

type PathItem = OpenApiDocument['paths'][string];
type Operation = NonNullable<PathItem['get']>;
type SchemaOrRef = NonNullable<NonNullable<OpenApiDocument['components']>['schemas']>[string];
type Schema = Exclude<SchemaOrRef, { $ref: string }>;

const METHODS = ['get', 'post', 'patch', 'put', 'delete'] as const;

interface FieldRow {
  readonly name: string;
  readonly type: string;
  readonly required: boolean;
  readonly defaultValue?: unknown;
  readonly description?: string;
  /** For a field of one form of a choice: the field that chooses, and the values that bring this one in. */
  readonly onlyWhen?: { readonly field: string; readonly values: readonly string[] };
}

export function referencePage(document: OpenApiDocument): string {
  const schemas = document.components?.schemas ?? {};
  const resolve = (schema: SchemaOrRef): Schema =>
    '$ref' in schema ? resolve(schemas[schema.$ref.split('/').at(-1)!]!) : schema;
  const operations = Object.entries(document.paths).flatMap(([path, item]) =>
    METHODS.flatMap((method) => (item[method] ? [{ method, path, operation: item[method] }] : [])),
  );
  const sections = (document.tags ?? []).map((tag) => {
    const mine = operations.filter(({ operation }) => operation.tags?.includes(tag.name));
    return `
    <section id="${anchor(tag.name)}">
      <h2>${escape(tag.name)}</h2>
      ${tag.description ? `<p>${prose(tag.description)}</p>` : ''}
      ${mine.map(({ method, path, operation }) => operationHtml(method, path, operation, resolve)).join('')}
    </section>`;
  });
  return `<!doctype html>
<html lang="en">
<head>
  <meta charset="utf-8">
  <meta name="viewport" content="width=device-width, initial-scale=1">
  <title>${escape(document.info.title)} reference</title>
  <style>${STYLE}</style>
</head>
<body>
  <header>
    <h1>${escape(document.info.title)} reference</h1>
    <p>${prose(document.info.description ?? '')}</p>
  </header>
  <main>
    <p>
      Every route the server answers, described from the same rules it checks requests with. The same
      description for programs: <a href="/api/openapi.json"><code>/api/openapi.json</code></a> (OpenAPI ${escape(document.openapi)}).
      Routes for signed-in people need the session cookie that signing in sets. Every error comes as
      <code>{ error: { code, message, fields?, retryAfterMinutes? } }</code>.
    </p>
    <nav aria-label="Sections">
      <ul>${(document.tags ?? []).map((tag) => `<li><a href="#${anchor(tag.name)}">${escape(tag.name)}</a></li>`).join('')}</ul>
    </nav>
    ${sections.join('')}
  </main>
</body>
</html>
`;
}

function operationHtml(method: string, path: string, operation: Operation, resolve: (s: SchemaOrRef) => Schema) {
  const access = operation[ACCESS_EXTENSION] as OperationAccess | undefined;
  const parameters = (operation.parameters ?? []).flatMap((parameter) =>
    '$ref' in parameter || !parameter.schema
      ? []
      : [{ name: parameter.name, type: typeOf(resolve(parameter.schema)), description: parameter.description ?? '' }],
  );
  const body = operation.requestBody && !('$ref' in operation.requestBody) ? operation.requestBody : undefined;
  const [bodyMedia, bodyContent] = Object.entries(body?.content ?? {})[0] ?? [];
  const bodySchema = bodyContent?.schema;
  const fields = bodySchema ? fieldRows(resolve(bodySchema), '', resolve) : [];
  const responses = Object.entries(operation.responses ?? {}) as [string, { description?: string }][];
  return `
      <article class="operation" id="${anchor(`${method} ${path}`)}">
        <h3><span class="method">${method.toUpperCase()}</span> <code>${escape(path)}</code></h3>
        <p class="summary">${escape(operation.summary ?? '')}</p>
        <p><strong>Who may call it:</strong> ${escape(access?.who ?? 'Anyone.')}</p>
        ${
          parameters.length === 0
            ? ''
            : table(
                'In the path',
                ['Parameter', 'Type', 'About'],
                parameters.map((p) => [`<code>{${escape(p.name)}}</code>`, escape(p.type), prose(p.description)]),
              )
        }
        ${
          fields.length === 0
            ? ''
            : table(
                bodyMedia === 'multipart/form-data'
                  ? 'Request body (a form, multipart/form-data)'
                  : 'Request body (JSON)',
                ['Field', 'Type', 'Required'],
                fields.map((field) => [
                  `<code>${escape(field.name)}</code>`,
                  escape(field.type),
                  escape(requiredness(field)),
                ]),
              )
        }
        ${table(
          'Answers',
          ['Status', 'Meaning'],
          responses.map(([status, response]) => [
            `<span class="status s${status.charAt(0)}xx">${escape(status)}</span>`,
            prose(response.description ?? ''),
          ]),
        )}
      </article>`;
}

/** The fields of a body, nested ones by their dotted path; a choice of forms lists each form's fields. */
function fieldRows(schema: Schema, prefix: string, resolve: (s: SchemaOrRef) => Schema): FieldRow[] {
  const rows: FieldRow[] = [];
  for (const [name, property] of Object.entries(schema.properties ?? {})) {
    const field = resolve(property);
    const path = prefix + name;
    rows.push({
      name: path,
      type: typeOf(field),
      required: schema.required?.includes(name) ?? false,
      defaultValue: field.default,
      description: field.description,
    });
    if (field.properties) rows.push(...fieldRows(field, `${path}.`, resolve));
    const items = field.items && resolve(field.items);
    if (items?.properties) rows.push(...fieldRows(items, `${path}[].`, resolve));
    if (field.oneOf) rows.push(...formRows(field.oneOf.map(resolve), `${path}.`, resolve));
  }
  return rows;
}

/** A choice among forms told apart by one field (shape.kind): that field once, then each form's own fields. */
function formRows(forms: Schema[], prefix: string, resolve: (s: SchemaOrRef) => Schema): FieldRow[] {
  const chooser = Object.keys(forms[0]?.properties ?? {}).find((name) =>
    forms.every((form) => resolve(form.properties?.[name] ?? {}).enum?.length === 1),
  );
  if (!chooser) return forms.flatMap((form) => fieldRows(form, prefix, resolve));
  const valueOf = (form: Schema) => String(resolve(form.properties![chooser]!).enum![0]);
  const rows = new Map<string, FieldRow>();
  rows.set(chooser, {
    name: prefix + chooser,
    type: inWords(
      forms.map((form) => JSON.stringify(valueOf(form))),
      'or',
    ),
    required: true,
  });
  for (const form of forms) {
    for (const row of fieldRows(form, prefix, resolve)) {
      if (row.name === prefix + chooser) continue;
      const key = `${row.name} ${row.type} ${row.required}`;
      const seen = rows.get(key);
      const values = [...(seen?.onlyWhen?.values ?? []), valueOf(form)];
      rows.set(key, { ...row, onlyWhen: { field: prefix + chooser, values } });
    }
  }
  return [...rows.values()];
}

function requiredness(field: FieldRow): string {
  const when = field.onlyWhen
    ? `when ${field.onlyWhen.field} is ${inWords(
        field.onlyWhen.values.map((value) => JSON.stringify(value)),
        'or',
      )}`
    : '';
  if (field.required) return when ? `yes, ${when}` : 'yes';
  const fallback = field.defaultValue === undefined ? '' : `, default ${JSON.stringify(field.defaultValue)}`;
  return `no${fallback}${when ? `; only ${when}` : ''}`;
}

function typeOf(schema: Schema): string {
  if (schema.oneOf) return `one of ${schema.oneOf.length} forms, fields below`;
  if (schema.enum)
    return inWords(
      schema.enum.map((value) => JSON.stringify(value)),
      'or',
    );
  switch (schema.type) {
    case 'string':
      return textType(schema);
    case 'number':
    case 'integer':
      return numberType(schema);
    case 'boolean':
      return 'true or false';
    case 'array': {
      const items = schema.items && !('$ref' in schema.items) ? schema.items : undefined;
      const of = items?.properties ? 'objects, fields below' : items ? typeOf(items) : 'values';
      return `list of ${of}${range(schema.minItems, schema.maxItems, 'items')}`;
    }
    case 'object':
      return schema.additionalProperties ? 'object with named values' : 'object, fields below';
    default:
      return 'any JSON value';
  }
}

const FORMATS: Readonly<Record<string, string>> = {
  uuid: 'id (UUID)',
  'date-time': 'date and time (ISO 8601, with offset)',
  date: 'date (YYYY-MM-DD)',
  email: 'e-mail address',
};

function textType(schema: Schema): string {
  const format = schema.format && FORMATS[schema.format];
  if (format) return format;
  if (schema.pattern) return `text matching ${schema.pattern}`;
  return `text${range(schema.minLength, schema.maxLength, 'characters')}`;
}

function numberType(schema: Schema): string {
  const kind = schema.type === 'integer' ? 'whole number' : 'number';
  const { minimum: min, maximum: max } = schema;
  if (min !== undefined && max !== undefined && !schema.exclusiveMinimum && !schema.exclusiveMaximum) {
    return `${kind} from ${min} to ${max}`;
  }
  const bounds = [
    min === undefined ? '' : `${schema.exclusiveMinimum ? 'more than' : 'at least'} ${min}`,
    max === undefined ? '' : `${schema.exclusiveMaximum ? 'less than' : 'at most'} ${max}`,
  ].filter(Boolean);
  return bounds.length === 0 ? kind : `${kind}, ${bounds.join(', ')}`;
}

function range(min: number | undefined, max: number | undefined, unit: string): string {
  if (min !== undefined && max !== undefined) return `, ${min} to ${max} ${unit}`;
  if (max !== undefined) return `, up to ${max} ${unit}`;
  if (min !== undefined && min > 0) return `, at least ${min} ${unit}`;
  return '';
}

function table(caption: string, headings: readonly string[], rows: readonly (readonly string[])[]): string {
  return `
        <div class="scroll"><table>
          <caption>${escape(caption)}</caption>
          <thead><tr>${headings.map((heading) => `<th scope="col">${escape(heading)}</th>`).join('')}</tr></thead>
          <tbody>${rows.map((cells) => `<tr>${cells.map((cell) => `<td>${cell}</td>`).join('')}</tr>`).join('')}</tbody>
        </table></div>`;
}

function anchor(text: string): string {
  return text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');
}

/** Escaped text, with `backticked` words set as code. */
function prose(text: string): string {
  return escape(text).replace(/`([^`]+)`/g, '<code>$1</code>');
}

function escape(text: string): string {
  return text.replace(
    /[&<>"']/g,
    (char) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[char]!,
  );
}

const STYLE = `
  :root { color-scheme: light; --teal: #17606B; --paper: #F7F4EE; --ink: #1f2b2d; --line: #d8d1c4; }
  * { box-sizing: border-box; }
  body {
    margin: 0; background: var(--paper); color: var(--ink);
    font: 16px/1.5 "Source Sans 3", system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif;
  }
  header { background: var(--teal); color: #fff; padding: 24px max(16px, calc((100% - 960px) / 2)); }
  header h1 { margin: 0 0 4px; font-size: 1.8rem; }
  header p { margin: 0; max-width: 60rem; }
  main { max-width: 960px; margin: 0 auto; padding: 8px 16px 48px; }
  a { color: var(--teal); }
  code { font-family: ui-monospace, SFMono-Regular, Menlo, Consolas, monospace; font-size: 0.9em; overflow-wrap: anywhere; }
  nav ul { display: flex; flex-wrap: wrap; gap: 4px 16px; padding: 0; list-style: none; }
  h2 { color: var(--teal); border-bottom: 2px solid var(--teal); padding-bottom: 4px; margin-top: 40px; }
  .operation { background: #fff; border: 1px solid var(--line); border-radius: 8px; padding: 12px 16px; margin: 16px 0; }
  .operation h3 { margin: 0; font-size: 1.05rem; display: flex; gap: 8px; align-items: baseline; flex-wrap: wrap; }
  .method {
    background: var(--teal); color: #fff; border-radius: 4px; padding: 0 8px; min-width: 4.5em; text-align: center;
    font: 600 0.8rem/1.8 ui-monospace, SFMono-Regular, Menlo, Consolas, monospace;
  }
  .summary { margin: 6px 0; font-size: 1.05rem; }
  td code { overflow-wrap: normal; }
  .scroll { overflow-x: auto; }
  table { border-collapse: collapse; width: 100%; margin: 8px 0; font-size: 0.95rem; }
  caption { text-align: left; font-weight: 600; color: var(--teal); padding: 4px 0; }
  th, td { text-align: left; vertical-align: top; padding: 4px 8px; border-bottom: 1px solid var(--line); }
  th { font-weight: 600; }
  .status { font-weight: 600; font-family: ui-monospace, SFMono-Regular, Menlo, Consolas, monospace; }
  .s2xx { color: var(--teal); }
  .s4xx, .s5xx { color: #8a2d1f; }
`;
