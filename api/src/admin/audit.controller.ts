import { Controller, Get, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { pageQuerySchema, type PageQuery } from '@driftgrid/domain';
import { Roles } from '../auth/access.decorators.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { AuditService } from './audit.service.js';

@ApiTags('admin')
@ApiBearerAuth()
@Roles('admin')
@Controller('admin/audit')
export class AuditController {
  constructor(private readonly audit: AuditService) {}

  @Get()
  @ApiOperation({ summary: 'Audit log of admin actions, newest first, paged' })
  list(@Query(new ZodValidationPipe(pageQuerySchema, 'query')) q: PageQuery) {
    return this.audit.list(q);
  }
}
