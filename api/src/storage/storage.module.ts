import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Global, Module } from '@nestjs/common';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { LocalDiskDriver } from './local-disk-driver.js';
import { MediaController } from './media.controller.js';
import { STORAGE_DRIVER, type StorageDriver } from './storage-driver.js';
import { StorageService } from './storage.service.js';

/** <checkout>/.local/storage: this file sits at api/src/storage or api/dist/storage. */
export const DEFAULT_STORAGE_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '../../../.local/storage');

/** Stored files (uploads, signed media URLs). Global: any feature may keep files. */
@Global()
@Module({
  controllers: [MediaController],
  providers: [
    {
      provide: STORAGE_DRIVER,
      inject: [ENV],
      // The folder is created at start, so the first upload cannot fail on a missing folder.
      useFactory: (env: Env): StorageDriver => new LocalDiskDriver(env.STORAGE_DIR ?? DEFAULT_STORAGE_DIR),
    },
    StorageService,
  ],
  exports: [StorageService, STORAGE_DRIVER],
})
export class StorageModule {}
