/**
 * The OpenAPI 3.1 description of /api/v1, generated from the same zod schemas
 * the handlers validate with (zod 4's built-in JSON Schema output), so the
 * description cannot drift from what the server accepts.
 */
import { z } from "zod";
import { conditionsSchema } from "@/lib/analysis/conditions";
import { apiTokenCreateSchema, chipCreateSchema, layerMapSchema, operatingPointFormSchema } from "@/lib/chips/schemas";

type Op = { method: "get" | "post" | "put" | "delete"; path: string; summary: string; body?: z.ZodType; multipart?: Record<string, string>; created?: boolean };

const OPERATIONS: Op[] = [
  { method: "get", path: "/api/v1/me", summary: "The signed-in user and their workspaces" },
  { method: "get", path: "/api/v1/workspaces/{workspaceId}/chips", summary: "List the workspace's chips" },
  { method: "post", path: "/api/v1/workspaces/{workspaceId}/chips", summary: "Create a chip (designer)", body: chipCreateSchema, created: true },
  { method: "get", path: "/api/v1/chips/{chipId}", summary: "A chip and its revision history" },
  { method: "get", path: "/api/v1/chips/{chipId}/revisions", summary: "A chip's revisions" },
  {
    method: "post",
    path: "/api/v1/chips/{chipId}/revisions",
    summary: "Upload a new revision (designer); 409 duplicate_revision when the same file is already a revision",
    multipart: { file: "the layout, an ASCII DXF", note: "what changed and why (optional)" },
    created: true,
  },
  { method: "get", path: "/api/v1/chips/{chipId}/revisions/{number}", summary: "A revision, its layer map and analyses" },
  { method: "get", path: "/api/v1/chips/{chipId}/revisions/{number}/file", summary: "The uploaded DXF, byte for byte" },
  { method: "put", path: "/api/v1/chips/{chipId}/revisions/{number}/layer-map", summary: "Map the revision's layers (once)", body: layerMapSchema, created: true },
  { method: "get", path: "/api/v1/chips/{chipId}/revisions/{number}/operating-points", summary: "Operating points and their analyses" },
  {
    method: "post",
    path: "/api/v1/chips/{chipId}/revisions/{number}/operating-points",
    summary: "Add an operating point and analyse it (designer)",
    body: operatingPointFormSchema,
    created: true,
  },
  { method: "get", path: "/api/v1/analyses/{analysisId}", summary: "A stored analysis with its full result document" },
  {
    method: "post",
    path: "/api/v1/analyze",
    summary: "Stateless analysis: file and conditions in, result out; nothing stored",
    multipart: { file: "the layout, an ASCII DXF", conditions: "the conditions document as JSON text" },
  },
  { method: "get", path: "/api/v1/workspaces/{workspaceId}/tokens", summary: "Your personal API tokens" },
  { method: "post", path: "/api/v1/workspaces/{workspaceId}/tokens", summary: "Create a personal API token (shown once)", body: apiTokenCreateSchema, created: true },
  { method: "delete", path: "/api/v1/tokens/{tokenId}", summary: "Revoke one of your tokens" },
];

const errorSchema = {
  type: "object",
  required: ["error"],
  properties: { error: { type: "object", required: ["code", "message"], properties: { code: { type: "string" }, message: { type: "string" }, details: {} } } },
};

function jsonSchema(schema: z.ZodType): unknown {
  // "input" describes what a client sends (defaults optional, before coercion).
  return z.toJSONSchema(schema, { io: "input", unrepresentable: "any" });
}

/** Builds the OpenAPI document. */
export function buildOpenApi(): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const op of OPERATIONS) {
    const params = [...op.path.matchAll(/\{(\w+)\}/g)].map((m) => ({ name: m[1], in: "path", required: true, schema: { type: "integer", minimum: 1 } }));
    const requestBody = op.body
      ? { required: true, content: { "application/json": { schema: jsonSchema(op.body) } } }
      : op.multipart
        ? {
            required: true,
            content: {
              "multipart/form-data": {
                schema: {
                  type: "object",
                  required: ["file"],
                  properties: Object.fromEntries(
                    Object.entries(op.multipart).map(([k, d]) => [k, k === "file" ? { type: "string", format: "binary", description: d } : { type: "string", description: d }]),
                  ),
                },
              },
            },
          }
        : undefined;
    paths[op.path] ??= {};
    paths[op.path][op.method] = {
      summary: op.summary,
      ...(params.length ? { parameters: params } : {}),
      ...(requestBody ? { requestBody } : {}),
      responses: {
        [op.created ? "201" : "200"]: { description: "Success", content: { "application/json": { schema: { type: "object" } } } },
        "4XX": { description: "The request cannot be served; the message says what to fix.", content: { "application/json": { schema: { $ref: "#/components/schemas/Error" } } } },
      },
    };
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "Stokeline API",
      version: "1",
      description: "Chips, revisions, operating points and analyses. Authenticate with a session cookie or `Authorization: Bearer <personal API token>`.",
    },
    components: {
      securitySchemes: { bearer: { type: "http", scheme: "bearer" }, session: { type: "apiKey", in: "cookie", name: "next-auth.session-token" } },
      schemas: { Error: errorSchema, Conditions: jsonSchema(conditionsSchema) },
    },
    security: [{ bearer: [] }, { session: [] }],
    paths,
  };
}
