import { Controller, Get, Param, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { sensitivityQuerySchema, type SensitivityQuery } from '@driftgrid/domain';
import { SignedIn } from '../auth/access.decorators.js';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { ClientSignal } from '../reads/client-signal.js';
import { SensitivityService } from './sensitivity.service.js';

@ApiTags('sensitivity')
@ApiBearerAuth()
@Controller('sweeps')
export class SensitivityController {
  constructor(private readonly sensitivity: SensitivityService) {}

  @Get(':id/sensitivity')
  @SignedIn()
  @ApiOperation({
    summary:
      'First-order and total Sobol indices of one output per swept input, with 95 % bootstrap intervals (Saltelli-design sweeps only; 409 otherwise)',
  })
  report(
    @CurrentUser() user: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Query(new ZodValidationPipe(sensitivityQuerySchema, 'query')) q: SensitivityQuery,
    @ClientSignal() signal: AbortSignal,
  ) {
    return this.sensitivity.report(user, id, q, signal);
  }
}
