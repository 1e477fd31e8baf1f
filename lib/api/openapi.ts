/**
 * The OpenAPI 3.1 description of /api/v1, generated from the same zod schemas
 * the handlers validate with (zod 4's built-in JSON Schema output), so the
 * description cannot drift from what the server accepts.
 */
import { z } from "zod";
import { conditionsSchema } from "@/lib/analysis/conditions";
import { apiTokenCreateSchema, chipCreateSchema, layerMapSchema, operatingPointFormSchema } from "@/lib/chips/schemas";
import {
  clearSchema,
  commentSchema,
  disposeFlagSchema,
  emailPreferencesSchema,
  markReadSchema,
  passFluidicsSchema,
  requestChangesSchema,
  resolveCommentSchema,
  submitSchema,
  updateAnalysisSchema,
  withdrawSchema,
} from "@/lib/review/schemas";
import { createShareLinkSchema } from "@/lib/reports/share";

type Op = { method: "get" | "post" | "put" | "patch" | "delete"; path: string; summary: string; body?: z.ZodType; multipart?: Record<string, string>; created?: boolean };

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
  { method: "get", path: "/api/v1/revisions/{revisionId}/review", summary: "Review state, your allowed steps, flags and comments" },
  { method: "post", path: "/api/v1/revisions/{revisionId}/review/submit", summary: "Submit for fluidics review (designer)", body: submitSchema },
  { method: "post", path: "/api/v1/revisions/{revisionId}/review/analysis", summary: "Put a newer analysis under review (designer)", body: updateAnalysisSchema },
  { method: "post", path: "/api/v1/revisions/{revisionId}/review/flags", summary: "Waive a flag with a justification, or mark it must-fix (fluidics reviewer)", body: disposeFlagSchema },
  { method: "post", path: "/api/v1/revisions/{revisionId}/review/pass", summary: "Pass fluidics review (fluidics reviewer)", body: passFluidicsSchema },
  { method: "post", path: "/api/v1/revisions/{revisionId}/review/request-changes", summary: "Send back with changes requested", body: requestChangesSchema },
  { method: "post", path: "/api/v1/revisions/{revisionId}/review/clear", summary: "Clear for tape-out with password re-entry (fab liaison)", body: clearSchema },
  { method: "post", path: "/api/v1/revisions/{revisionId}/review/withdraw", summary: "Withdraw before clearance (uploader)", body: withdrawSchema },
  { method: "get", path: "/api/v1/revisions/{revisionId}/review/comments", summary: "Comments on the revision" },
  { method: "post", path: "/api/v1/revisions/{revisionId}/review/comments", summary: "Comment, optionally pinned to a segment or point", body: commentSchema, created: true },
  { method: "patch", path: "/api/v1/revisions/{revisionId}/review/comments/{commentId}", summary: "Resolve or reopen a comment", body: resolveCommentSchema },
  { method: "get", path: "/api/v1/revisions/{revisionId}/audit", summary: "The revision's audit trail (?format=json or csv); read-only" },
  { method: "get", path: "/api/v1/notifications", summary: "Your in-app inbox" },
  { method: "post", path: "/api/v1/notifications/read", summary: "Mark notifications read", body: markReadSchema },
  { method: "get", path: "/api/v1/notifications/preferences", summary: "Your e-mail preferences" },
  { method: "put", path: "/api/v1/notifications/preferences", summary: "Change your e-mail preferences", body: emailPreferencesSchema },
  { method: "get", path: "/api/v1/revisions/{revisionId}/brief.pdf", summary: "The revision's brief as a PDF (generated on demand)" },
  { method: "get", path: "/api/v1/revisions/{revisionId}/share-links", summary: "Share links of the revision's brief (lead, admin)" },
  { method: "post", path: "/api/v1/revisions/{revisionId}/share-links", summary: "Create a read-only share link with an expiry (lead, admin)", body: createShareLinkSchema, created: true },
  { method: "delete", path: "/api/v1/share-links/{id}", summary: "Revoke a share link" },
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
