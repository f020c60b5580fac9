import { Body, Controller, Get, Param, Post, Query, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import { CREATOR_ROLES, fitRequestSchema, type FitRequest } from '@driftgrid/domain';
import type { Response } from 'express';
import { Roles, SignedIn } from '../auth/access.decorators.js';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { createFitSchema, fitListQuerySchema, type FitListQuery } from './dto/fit.dto.js';
import { FitsService } from './fits.service.js';

@ApiTags('fits')
@ApiBearerAuth()
@Controller('fits')
export class FitsController {
  constructor(private readonly fits: FitsService) {}

  @Post()
  @Roles(...CREATOR_ROLES)
  @ApiOperation({
    summary:
      'Fit a reduced model to a sweep\'s results or a dataset: 201 with the result; 202 { id, status: "queued" } from 100,000 points on',
  })
  @ApiBody({ schema: openApiSchema(fitRequestSchema) })
  async create(
    @CurrentUser() user: AuthUser,
    @Body(new ZodValidationPipe(createFitSchema)) body: FitRequest,
    @Res({ passthrough: true }) res: Response,
  ) {
    const { status, body: out } = await this.fits.create(user, body);
    res.status(status);
    return out;
  }

  @Get()
  @SignedIn()
  @ApiOperation({ summary: 'Fits whose source you may read, newest first; filter by sourceKind and sourceId' })
  list(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(fitListQuerySchema, 'query')) q: FitListQuery) {
    return this.fits.list(user, q);
  }

  @Get(':id')
  @SignedIn()
  @ApiOperation({ summary: 'One fit with parameters, 95 % intervals, goodness of fit, plot data, status and progress' })
  get(@CurrentUser() user: AuthUser, @Param('id', new IdParamPipe()) id: number) {
    return this.fits.get(user, id);
  }
}
