/** The shape of one documented route, shared by the OpenAPI document and each area's route list. */
import { z } from 'zod';

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';
export type RouteDoc = {
  method: Method;
  path: string;
  summary: string;
  tag: string;
  permission: string;
  params?: z.ZodObject;
  query?: z.ZodObject;
  body?: z.ZodType;
  /** multipart/form-data body instead of JSON. */
  multipart?: z.ZodObject;
  ok: { status: number; schema?: z.ZodType; description: string };
  errors?: number[];
};


export const siteParams = z.object({ siteId: z.string().meta({ description: 'Site id', example: 'site_3fQk...' }) });
