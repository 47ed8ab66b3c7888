import { Controller, ForbiddenException, Get, GoneException, NotFoundException, Param, Req, Res } from '@nestjs/common';
import { ApiForbiddenResponse, ApiGoneResponse, ApiNotFoundResponse, ApiParam, ApiProduces, ApiResponse, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { pipeline } from 'node:stream/promises';
import { PublicRoute } from '../auth/auth.decorators.js';
import { StorageService } from './storage.service.js';

/**
 * Serves stored media through signed URLs: a media element cannot send a bearer token, so the
 * URL itself is the short-lived permission. Honours HTTP Range (RFC 9110 §14) so players can seek.
 */
@ApiTags('media')
@Controller('media')
export class MediaController {
  constructor(private readonly storage: StorageService) {}

  @Get(':token')
  @PublicRoute(
    'Stream a stored recording through a signed URL',
    'The URL comes from the feature that owns the file (e.g. a recording’s playback link) and expires after a few minutes. Supports Range requests: 206 with Content-Range, 416 when the range is outside the file.',
  )
  @ApiParam({ name: 'token', description: 'Signed, expiring grant for one file.' })
  @ApiProduces('audio/*', 'video/*')
  @ApiResponse({ status: 206, description: 'The requested byte range.' })
  @ApiResponse({ status: 416, description: 'The range is outside the file.' })
  @ApiForbiddenResponse({ description: 'The link is not valid (altered or malformed).' })
  @ApiGoneResponse({ description: 'The link has expired: ask for a new one.' })
  @ApiNotFoundResponse({ description: 'The file is no longer stored.' })
  async stream(@Param('token') token: string, @Req() req: Request, @Res() res: Response): Promise<void> {
    const check = this.storage.verify(token);
    if (!check.ok) {
      if (check.reason === 'expired') throw new GoneException('This playback link has expired. Reload the recording to get a new one.');
      throw new ForbiddenException('This playback link is not valid.');
    }
    const { grant } = check;
    const stat = await this.storage.driver.stat(grant.key);
    if (!stat) throw new NotFoundException('This recording is no longer stored.');
    const size = stat.size;

    res.setHeader('Accept-Ranges', 'bytes');
    // Private and no longer than the link lives.
    const maxAge = Math.max(0, grant.expiresAt - Math.floor(Date.now() / 1000));
    res.setHeader('Cache-Control', `private, max-age=${maxAge}`);

    // Express's req.range (range-parser): undefined without a header, -1 unsatisfiable, -2 malformed.
    const ranges = req.headers.range ? req.range(size, { combine: true }) : undefined;
    if (ranges === -1) {
      res.status(416).setHeader('Content-Range', `bytes */${size}`);
      res.json({ statusCode: 416, error: 'Range Not Satisfiable', message: `The file has ${size} bytes; the range asked for is outside it.` });
      return;
    }
    res.setHeader('Content-Type', grant.contentType);
    res.setHeader('Content-Disposition', 'inline');
    // A malformed header, a non-byte unit or several ranges: the whole file (a server may ignore Range).
    const one = Array.isArray(ranges) && ranges.type === 'bytes' && ranges.length === 1 ? ranges[0] : undefined;
    if (one) {
      res.status(206);
      res.setHeader('Content-Range', `bytes ${one.start}-${one.end}/${size}`);
      res.setHeader('Content-Length', String(one.end - one.start + 1));
    } else {
      res.status(200);
      res.setHeader('Content-Length', String(size));
    }
    if (req.method === 'HEAD' || size === 0) {
      res.end();
      return;
    }
    const body = this.storage.driver.read(grant.key, one ? { start: one.start, end: one.end } : undefined);
    // A player that seeks closes the previous request: that is normal, not an error.
    await pipeline(body, res).catch((err: NodeJS.ErrnoException) => {
      if (err.code !== 'ERR_STREAM_PREMATURE_CLOSE') throw err;
    });
  }
}
