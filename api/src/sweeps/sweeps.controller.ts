import { Body, Controller, Delete, Get, HttpCode, Param, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import { CREATOR_ROLES, sweepDefinitionSchema, sweepSubmissionSchema, type SweepSubmission } from '@driftgrid/domain';
import { Roles, SignedIn } from '../auth/access.decorators.js';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { SweepsService } from './sweeps.service.js';

@ApiTags('sweeps')
@ApiBearerAuth()
@Controller('sweeps')
export class SweepsController {
  constructor(private readonly sweeps: SweepsService) {}

  @Post('preview')
  @HttpCode(200)
  @Roles(...CREATOR_ROLES)
  @ApiOperation({ summary: 'Point count, chunks, time estimate, quota verdict and every definition error' })
  @ApiBody({ schema: openApiSchema(sweepDefinitionSchema) })
  preview(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(sweepSubmissionSchema)) body: SweepSubmission) {
    return this.sweeps.preview(user, body);
  }

  @Post()
  @Roles(...CREATOR_ROLES)
  @ApiOperation({ summary: 'Submit a sweep: 201 { id, status, points }; 400 bad definition; 429 quota' })
  @ApiBody({ schema: openApiSchema(sweepDefinitionSchema) })
  create(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(sweepSubmissionSchema)) body: SweepSubmission) {
    return this.sweeps.create(user, body);
  }

  @Get(':id')
  @SignedIn()
  @ApiOperation({ summary: 'Definition, status, progress and provenance of a sweep' })
  get(@CurrentUser() user: AuthUser, @Param('id', new IdParamPipe()) id: number) {
    return this.sweeps.get(user, id);
  }

  @Post(':id/cancel')
  @HttpCode(200)
  @Roles(...CREATOR_ROLES)
  @ApiOperation({ summary: 'Cancel a queued or running sweep (owner or admin)' })
  cancel(@CurrentUser() user: AuthUser, @Param('id', new IdParamPipe()) id: number) {
    return this.sweeps.cancel(user, id);
  }

  @Delete(':id')
  @HttpCode(204)
  @Roles(...CREATOR_ROLES)
  @ApiOperation({ summary: 'Delete a sweep and its results (owner or admin; archived sweeps cannot be deleted)' })
  async remove(@CurrentUser() user: AuthUser, @Param('id', new IdParamPipe()) id: number): Promise<void> {
    await this.sweeps.remove(user, id);
  }
}
