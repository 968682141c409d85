import { StreamableFile } from '@nestjs/common';
import { ExpressAdapter } from '@nestjs/platform-express';
import type { Response } from 'express';

/**
 * Nest's Express adapter, answering a handler's plain object or array with the JSON written straight to
 * the response. Express's res.json() would parse and re-format the Content-Type header, hash the body for
 * an ETag and test the request's freshness on every answer: measurable per request on the pipeline list,
 * and nothing here uses ETags (they are off: app.factory.ts). The body is JSON.stringify'd as res.json()
 * does with its default settings; anything else — no body, a string, a Buffer, a stream, a 204/304, or a
 * handler that set its own Content-Type — goes through Nest's own reply unchanged.
 */
export class JsonReplyAdapter extends ExpressAdapter {
  override reply(response: Response, body: unknown, statusCode?: number): unknown {
    const status = statusCode ?? response.statusCode;
    if (
      body === null ||
      typeof body !== 'object' ||
      body instanceof StreamableFile ||
      Buffer.isBuffer(body) ||
      status === 204 ||
      status === 304 ||
      response.getHeader('Content-Type') !== undefined
    ) {
      return super.reply(response, body, statusCode);
    }
    const json = JSON.stringify(body);
    response.statusCode = status;
    response.setHeader('Content-Type', 'application/json; charset=utf-8');
    response.setHeader('Content-Length', Buffer.byteLength(json));
    return response.end(response.req.method === 'HEAD' ? undefined : json);
  }
}
