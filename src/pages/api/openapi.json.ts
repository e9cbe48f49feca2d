import type { APIRoute } from 'astro';
import { json } from '../../lib/http';
import { openApiDocument } from '../../lib/openapi';

export const GET: APIRoute = () => json(openApiDocument());
