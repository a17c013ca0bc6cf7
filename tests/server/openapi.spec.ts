import type { Express } from 'express';
import request from 'supertest';
import { listRoutes } from '../support/routes.js';
import { testApp } from '../support/test-app.js';

interface Described {
  openapi: string;
  paths: Record<string, Record<string, unknown>>;
  components: { schemas: Record<string, { required?: string[]; properties?: Record<string, unknown> }> };
}

/** "GET /api/workshops/:workshopId/builds" as the document writes it: "GET /api/workshops/{workshopId}/builds". */
function inOpenApiForm(route: string): string {
  return route.replace(/:(\w+)/g, '{$1}');
}

function documented(document: Described): string[] {
  return Object.entries(document.paths).flatMap(([path, item]) =>
    Object.keys(item).map((method) => `${method.toUpperCase()} ${path}`),
  );
}

describe('the API description', () => {
  let app: Express;
  let document: Described;

  beforeAll(async () => {
    app = await testApp();
    document = (await request(app).get('/api/openapi.json').expect(200)).body as Described;
  });

  it('should answer GET /api/openapi.json with an OpenAPI 3 document as JSON', async () => {
    const response = await request(app).get('/api/openapi.json');

    expect(response.status).toBe(200);
    expect(response.type).toBe('application/json');
    expect(response.body.openapi).toMatch(/^3\.\d+\.\d+$/);
    expect(response.body.info.title).toBe('Benchtide API');
  });

  it('should describe every API route the app answers, and no route it does not', () => {
    const answered = listRoutes(app)
      .filter((route) => route.includes(' /api/'))
      .map(inOpenApiForm);
    const described = documented(document);

    expect(answered.filter((route) => !described.includes(route))).toEqual([]);
    expect(described.filter((route) => !answered.includes(route))).toEqual([]);
  });

  it('should describe the sign-up body from the schema the route validates with', () => {
    const signUp = document.paths['/api/auth/sign-up']!['post'] as {
      requestBody: { content: Record<string, { schema: { $ref: string } }> };
      responses: Record<string, unknown>;
    };

    const ref = signUp.requestBody.content['application/json']!.schema.$ref;
    const schema = document.components.schemas[ref.split('/').at(-1)!]!;

    expect(schema.required).toEqual(jasmine.arrayWithExactContents(['email', 'displayName', 'password']));
    expect(Object.keys(schema.properties!)).toContain('invitationToken');
    expect(Object.keys(signUp.responses)).toEqual(jasmine.arrayContaining(['202', '400', '429']));
  });

  it('should mark routes for members with the session cookie and the roles the policy allows', () => {
    const exportJson = document.paths['/api/workshops/{workshopId}/export.json']!['get'] as {
      security: object[];
      'x-benchtide-access': { roles: string[] };
    };
    const health = document.paths['/api/health']!['get'] as { security: object[] };

    expect(exportJson.security).toEqual([{ session: [] }]);
    expect(exportJson['x-benchtide-access'].roles).toEqual(['owner']);
    expect(health.security).toEqual([]);
  });

  it('should answer GET /api/reference with a page listing the routes', async () => {
    const response = await request(app).get('/api/reference');

    expect(response.status).toBe(200);
    expect(response.type).toBe('text/html');
    expect(response.text).toContain('/api/auth/sign-up');
    expect(response.text).toContain('/api/workshops/{workshopId}/builds/{buildId}');
    expect(response.text).toContain('/api/workshops/{workshopId}/export/{table}.csv');
    expect(response.text).not.toMatch(/<script|https?:\/\//);
  });
});
