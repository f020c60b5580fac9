import { Controller, Get, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { CREATOR_ROLES, directoryQuerySchema } from '@driftgrid/domain';
import type { z } from 'zod';
import { Roles } from '../auth/access.decorators.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { CatalogueService } from './catalogue.service.js';

/** People to share with: ids, names and roles only (no e-mail addresses), for those who can share. */
@ApiTags('catalogue')
@ApiBearerAuth()
@Controller('users')
export class DirectoryController {
  constructor(private readonly catalogue: CatalogueService) {}

  @Get('directory')
  @Roles(...CREATOR_ROLES)
  @ApiOperation({ summary: 'Active users by name for the share dialog: { items: [{ id, name, role }] }' })
  directory(@Query(new ZodValidationPipe(directoryQuerySchema, 'query')) q: z.infer<typeof directoryQuerySchema>) {
    return this.catalogue.directory(q.q, q.pageSize);
  }
}
