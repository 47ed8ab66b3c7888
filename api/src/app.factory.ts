import 'reflect-metadata';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import cookieParser from 'cookie-parser';
import type { NextFunction, Request, Response } from 'express';
import helmet from 'helmet';
import { AppModule } from './app.module.js';
import { requestContextMiddleware } from './common/request-context.js';
import type { Env } from './config/env.js';

/** Builds the configured application; main.ts listens, tests use it in-process. */
export async function createApp(env: Env, opts: { logger?: boolean } = {}): Promise<NestExpressApplication> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule, {
    logger: opts.logger === false ? false : ['error', 'warn', 'log'],
  });
  if (env.TRUST_PROXY) app.set('trust proxy', 1);
  app.disable('x-powered-by');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'media-src': ["'self'", 'blob:'],
          // PrimeReact sets element styles at run time.
          'style-src': ["'self'", "'unsafe-inline'"],
          'script-src': ["'self'"],
        },
      },
    }),
  );
  app.use(cookieParser());
  app.use(requestContextMiddleware);
  app.setGlobalPrefix('api');

  const doc = new DocumentBuilder()
    .setTitle('Stavemark API')
    .setDescription('Technique assessment for piano teachers, music schools and mock examiners.')
    .setVersion('0.1.0')
    .addBearerAuth()
    .build();
  SwaggerModule.setup('api/docs', app, () => SwaggerModule.createDocument(app, doc), {
    jsonDocumentUrl: 'api/docs-json',
  });

  if (env.WEB_DIST && existsSync(join(env.WEB_DIST, 'index.html'))) serveWeb(app, env.WEB_DIST);
  return app;
}

/** The built web client from the same origin, with the SPA's routes falling back to index.html. */
function serveWeb(app: NestExpressApplication, dir: string): void {
  app.useStaticAssets(dir, { index: false, maxAge: '1h', immutable: false });
  const index = join(dir, 'index.html');
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' || req.path.startsWith('/api')) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}
