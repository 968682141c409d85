import 'reflect-metadata';
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule, type OpenAPIObject } from '@nestjs/swagger';
import express, { type NextFunction, type Request, type Response } from 'express';
import helmet from 'helmet';
import { Logger } from 'nestjs-pino';
import { AppModule } from './app.module';
import type { AppConfig } from './config/config';
import { createValidationPipe } from './common/validation';
import { bodyParserErrors } from './common/exception.filter';
import { JsonReplyAdapter } from './common/json-reply.adapter';

export function openApiDocument(app: NestExpressApplication): OpenAPIObject {
  const config = new DocumentBuilder()
    .setTitle('Loambook API')
    .setDescription('Leads to paid-in-full for foundation-repair contractors. Decimal amounts are strings.')
    .setVersion('0.1.0')
    .addBearerAuth()
    .build();
  return SwaggerModule.createDocument(app, config);
}

const REQUEST_ID = /^[A-Za-z0-9._-]{8,64}$/;

/** First of all: every request gets an id (the caller's when it looks like one), echoed in X-Request-Id. */
function assignRequestId(req: Request & { id?: string }, res: Response, next: NextFunction) {
  const given = req.headers['x-request-id'];
  req.id = typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
  res.setHeader('X-Request-Id', req.id);
  next();
}

/** Builds the whole application: used by main.ts and by the API tests, so both run the same stack. */
export async function createApp(config: AppConfig): Promise<NestExpressApplication> {
  const app = await NestFactory.create<NestExpressApplication>(
    AppModule.forRoot(config),
    new JsonReplyAdapter(),
    { bufferLogs: true, bodyParser: false },
  );
  app.useLogger(app.get(Logger));
  app.set('trust proxy', 'loopback');
  app.set('query parser', 'simple');
  // No ETags on the answers (res.send would hash every body for one): nothing in the app revalidates an
  // API answer (no If-None-Match, no 304 handling), and the answers are per person and change with every
  // write. Static files (serve-static, sendFile) keep their own ETags.
  app.set('etag', false);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Swagger UI needs inline styles; the screens need data: images (signatures) and blob: (photos).
          'img-src': ["'self'", 'data:', 'blob:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'upgrade-insecure-requests': null,
        },
      },
      crossOriginOpenerPolicy: { policy: 'same-origin' },
      strictTransportSecurity: false,
    }),
  );
  app.use(assignRequestId);
  // The processor's webhook is verified against the exact bytes it signed: keep that body raw (a Buffer).
  app.use('/api/payments/webhook', express.raw({ type: '*/*', limit: '1mb' }), bodyParserErrors);
  app.use('/api', express.json({ limit: '1mb' }), bodyParserErrors);
  app.setGlobalPrefix('api');
  app.useGlobalPipes(createValidationPipe());
  SwaggerModule.setup('api/docs', app, () => openApiDocument(app), {
    jsonDocumentUrl: 'api/docs/openapi.json',
  });

  if (config.frontendDist && existsSync(path.join(config.frontendDist, 'index.html'))) {
    const dist = config.frontendDist;
    app.useStaticAssets(dist, { index: false, maxAge: '1h', immutable: false });
    // Any other GET outside /api is a screen: hand it the single-page app.
    app.use((req: Request, res: Response, next: NextFunction) => {
      if (req.method !== 'GET' || req.path.startsWith('/api')) return next();
      res.sendFile(path.join(dist, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } });
    });
  }
  return app;
}
