import { Body, Controller, Get, Param, Put, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  CREATOR_ROLES,
  foldSliceParams,
  resultsQuerySchema,
  seriesQuerySchema,
  sweepListQuerySchema,
  sweepSharingSchema,
  type ResultsQuery,
  type SeriesQuery,
  type SweepListQuery,
  type SweepSharing,
} from '@driftgrid/domain';
import { Roles, SignedIn } from '../auth/access.decorators.js';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ClientSignal } from '../reads/client-signal.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { CatalogueService } from './catalogue.service.js';

/** Series queries carry `slice.<param>` keys; they are folded into one object before validation. */
const seriesPipe = new ZodValidationPipe(seriesQuerySchema, 'query');
const seriesQuery = { transform: (v: unknown) => seriesPipe.transform(foldSliceParams(v)) };

@ApiTags('catalogue')
@ApiBearerAuth()
@Controller('sweeps')
export class CatalogueController {
  constructor(private readonly catalogue: CatalogueService) {}

  @Get()
  @SignedIn()
  @ApiOperation({
    summary:
      'Catalogue of the sweeps you may see: paged, sorted, filtered by text, model, status, owner, tag, dates, points, scope',
  })
  list(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(sweepListQuerySchema, 'query')) q: SweepListQuery) {
    return this.catalogue.list(user, q);
  }

  @Get(':id/results')
  @SignedIn()
  @ApiOperation({ summary: 'A page of result rows: sort=col:dir, filter={"col":{"gte":…}}, valid=true|false' })
  results(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Query(new ZodValidationPipe(resultsQuerySchema, 'query')) q: ResultsQuery,
    @ClientSignal() signal: AbortSignal,
  ) {
    return this.catalogue.results(user, id, q, signal);
  }

  @Get(':id/series')
  @SignedIn()
  @ApiOperation({
    summary:
      'Down-sampled plot data: kind=line (x, y, groupBy) or heatmap (x, y, z); slice.<param>=k or agg=mean; units on every axis',
  })
  series(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Query(seriesQuery) q: SeriesQuery,
    @ClientSignal() signal: AbortSignal,
  ) {
    return this.catalogue.series(user, id, q, signal);
  }

  @Put(':id/sharing')
  @Roles(...CREATOR_ROLES)
  @ApiOperation({
    summary: 'Share read-only with named users and/or the whole group (owner or admin; 409 when archived)',
  })
  @ApiBody({ schema: openApiSchema(sweepSharingSchema) })
  share(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Body(new ZodValidationPipe(sweepSharingSchema)) body: SweepSharing,
  ) {
    return this.catalogue.share(user, id, body);
  }
}
