import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  Post,
  Put,
  Query,
  UploadedFile,
  UseInterceptors,
} from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  CREATOR_ROLES,
  datasetListQuerySchema,
  datasetRowsQuerySchema,
  datasetSeriesQuerySchema,
  datasetSharingSchema,
  datasetUploadFieldsSchema,
  type DatasetListQuery,
  type DatasetRowsQuery,
  type DatasetSeriesQuery,
  type DatasetSharing,
  type DatasetUploadFields,
} from '@driftgrid/domain';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { Roles, SignedIn } from '../auth/access.decorators.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ClientSignal } from '../reads/client-signal.js';
import { CsvUploadInterceptor } from './csv-upload.interceptor.js';
import { DatasetsService, type UploadedCsv } from './datasets.service.js';

@ApiTags('datasets')
@ApiBearerAuth()
@Controller('datasets')
export class DatasetsController {
  constructor(private readonly datasets: DatasetsService) {}

  @Post()
  @Roles(...CREATOR_ROLES)
  @UseInterceptors(CsvUploadInterceptor)
  @ApiConsumes('multipart/form-data')
  @ApiOperation({
    summary:
      'Upload a CSV with a header row: 201 { id, name, rows, columns }; 400 with line/column details; 413 over the limits',
  })
  @ApiBody({
    schema: {
      type: 'object',
      required: ['file'],
      properties: {
        file: { type: 'string', format: 'binary' },
        name: { type: 'string' },
        units: {
          type: 'string',
          description: 'JSON object { column: unit }, mathjs unit strings, e.g. {"phi":"V","n":"cm^-3"}',
        },
        visibility: { type: 'string', enum: ['private', 'group'] },
      },
    },
  })
  upload(
    @CurrentUser() user: AuthUser,
    @UploadedFile() file: UploadedCsv | undefined,
    @Body(new ZodValidationPipe(datasetUploadFieldsSchema)) fields: DatasetUploadFields,
  ) {
    return this.datasets.upload(user, file, fields);
  }

  @Get()
  @SignedIn()
  @ApiOperation({ summary: 'Datasets the caller may read (own, group, shared; admins all), newest first' })
  list(
    @CurrentUser() user: AuthUser,
    @Query(new ZodValidationPipe(datasetListQuerySchema, 'query')) q: DatasetListQuery,
  ) {
    return this.datasets.list(user, q);
  }

  @Get(':id')
  @SignedIn()
  @ApiOperation({ summary: 'Dataset metadata: columns with original and canonical units' })
  get(@CurrentUser() user: AuthUser, @Param('id', new IdParamPipe()) id: number) {
    return this.datasets.get(user, id);
  }

  @Get(':id/rows')
  @SignedIn()
  @ApiOperation({ summary: 'A page of rows (cells in column order, numbers in canonical units)' })
  rows(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Query(new ZodValidationPipe(datasetRowsQuerySchema, 'query')) q: DatasetRowsQuery,
  ) {
    return this.datasets.rows(user, id, q);
  }

  @Get(':id/series')
  @SignedIn()
  @ApiOperation({ summary: 'Points of two numeric columns in canonical units, for overlays on sweep plots' })
  series(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Query(new ZodValidationPipe(datasetSeriesQuerySchema, 'query')) q: DatasetSeriesQuery,
    @ClientSignal() signal: AbortSignal,
  ) {
    return this.datasets.series(user, id, q, signal);
  }

  @Put(':id/sharing')
  @Roles(...CREATOR_ROLES)
  @ApiOperation({ summary: 'Set visibility (private | group) and the users it is shared with (owner or admin)' })
  @ApiBody({ schema: openApiSchema(datasetSharingSchema) })
  share(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Body(new ZodValidationPipe(datasetSharingSchema)) body: DatasetSharing,
  ) {
    return this.datasets.setSharing(user, id, body);
  }

  @Delete(':id')
  @HttpCode(204)
  @Roles(...CREATOR_ROLES)
  @ApiOperation({ summary: 'Delete a dataset and its rows (owner or admin)' })
  remove(@CurrentUser() user: AuthUser, @Param('id', new IdParamPipe()) id: number): void {
    this.datasets.remove(user, id);
  }
}
