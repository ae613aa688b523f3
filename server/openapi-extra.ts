// Routes of curves, gains, review, designs, surface and proposals, documented beside the core ones.
import { z } from 'zod';
import type { RouteDoc } from './openapi';
import { uploadFieldsSchema } from './curves/router';

const fileField = z.string().describe('the file (CSV, TSV, TXT or XLSX)');

export const extraRoutes: RouteDoc[] = [
  { method: 'post', path: '/api/builds/{id}/curves', summary: 'Upload a curve file: 201 {curve} or 422 with the reason', multipart: { file: fileField, ...uploadFieldsSchema.shape }, tag: 'curves' },
  { method: 'post', path: '/api/builds/{id}/curves/preview', summary: 'Detect columns and units of a file without storing it', multipart: { file: fileField, ...uploadFieldsSchema.shape }, tag: 'curves' },
  { method: 'get', path: '/api/curves/{id}', summary: 'Curve points and metrics (long logs downsampled: maxPoints, fromHours, toHours)', tag: 'curves' },
  { method: 'patch', path: '/api/curves/{id}', summary: 'Relabel a curve or set durability options (break-in, windows, loss fraction)', body: z.object({ label: z.string().optional(), breakInHours: z.number().optional(), windows: z.array(z.object({ fromHours: z.number(), toHours: z.number() })).optional(), lossFraction: z.number().optional() }), tag: 'curves' },
  { method: 'delete', path: '/api/curves/{id}', summary: 'Remove a curve (the raw file stays)', tag: 'curves' },
  { method: 'get', path: '/api/files/{id}/raw', summary: 'The uploaded bytes, unchanged', tag: 'curves' },
  { method: 'get', path: '/api/projects/{id}/import-profiles', summary: 'Saved column/unit mappings', tag: 'curves' },
  { method: 'post', path: '/api/projects/{id}/import-profiles', summary: 'Save a column/unit mapping for a lab’s file shape', body: z.object({ name: z.string(), labId: z.number().nullish(), kind: z.enum(['polarization', 'durability', 'hold']).optional(), mapping: z.record(z.string(), z.object({ header: z.string(), unit: z.string() })) }), tag: 'curves' },
  { method: 'delete', path: '/api/import-profiles/{id}', summary: 'Remove an import profile', tag: 'curves' },
];
