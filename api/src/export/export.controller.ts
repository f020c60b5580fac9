import { Controller, Get, HttpCode, Param, Post, Req, Res } from '@nestjs/common';
import { CREATOR_ROLES } from '@driftgrid/domain';
import { ApiBearerAuth, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { Roles, SignedIn } from '../auth/access.decorators.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { Downloads } from './downloads.service.js';
import { SweepArchiver } from './sweep-archive.service.js';

@ApiTags('export')
@ApiBearerAuth()
@Controller('sweeps')
export class SweepExportController {
  constructor(
    private readonly downloads: Downloads,
    private readonly archiver: SweepArchiver,
  ) {}

  @Get(':id/export')
  @SignedIn()
  @ApiProduces('application/zip')
  @ApiOperation({
    summary:
      'Zipped CSV (results.csv, columns.csv, manifest.json, README.txt), streamed; archived sweeps get the frozen file with ETag and X-Archive-SHA256',
  })
  async export(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    await this.downloads.sweep(user, id, req, res);
  }

  @Post(':id/archive')
  @HttpCode(200)
  @Roles(...CREATOR_ROLES)
  @ApiOperation({
    summary:
      'Freeze a completed sweep (owner or admin): builds the zip once, records its SHA-256; 409 unless completed',
  })
  archive(@CurrentUser() user: AuthUser, @Param('id', new IdParamPipe()) id: number) {
    return this.archiver.archive(user, id);
  }
}

@ApiTags('export')
@ApiBearerAuth()
@Controller('datasets')
export class DatasetExportController {
  constructor(private readonly downloads: Downloads) {}

  @Get(':id/export')
  @SignedIn()
  @ApiProduces('application/zip')
  @ApiOperation({
    summary: 'Zipped CSV of a dataset (data.csv in canonical units, columns.csv, manifest.json, README.txt)',
  })
  async export(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Res() res: Response,
  ): Promise<void> {
    await this.downloads.dataset(user, id, res);
  }
}
