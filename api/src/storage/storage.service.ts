import { Inject, Injectable } from '@nestjs/common';
import type { Request, Response } from 'express';
import { now } from '../common/clock.js';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { mediaKeyFrom, signMediaToken, verifyMediaToken, type TokenCheck } from './signed-urls.js';
import { STORAGE_DRIVER, type StorageDriver } from './storage-driver.js';
import { receiveUpload, type ReceivedUpload, type UploadOptions } from './upload-receiver.js';

export interface SignedMediaUrl {
  /** Same-origin path under /api/media, usable as a media element's src. */
  url: string;
  expiresAt: string;
}

/** Stored files for every feature: uploads in, signed URLs out, deletion. */
@Injectable()
export class StorageService {
  private readonly urlKey: Buffer;

  constructor(
    @Inject(STORAGE_DRIVER) readonly driver: StorageDriver,
    @Inject(ENV) private readonly env: Env,
  ) {
    this.urlKey = mediaKeyFrom(env.JWT_SECRET);
  }

  /** Streams the request's multipart file to storage (see receiveUpload). Check access before calling. */
  receive(req: Request, res: Response, opts: UploadOptions): Promise<ReceivedUpload> {
    return receiveUpload(this.driver, req, res, opts);
  }

  /** A URL for one object, valid for MEDIA_URL_TTL_SECONDS (or less). Check access before calling. */
  signedUrl(key: string, contentType: string, ttlSeconds = this.env.MEDIA_URL_TTL_SECONDS): SignedMediaUrl {
    const expiresAt = Math.floor(now().getTime() / 1000) + ttlSeconds;
    return {
      url: `/api/media/${signMediaToken(this.urlKey, { key, contentType, expiresAt })}`,
      expiresAt: new Date(expiresAt * 1000).toISOString(),
    };
  }

  verify(token: string): TokenCheck {
    return verifyMediaToken(this.urlKey, token, Math.floor(now().getTime() / 1000));
  }

  delete(key: string): Promise<void> {
    return this.driver.delete(key);
  }
}
