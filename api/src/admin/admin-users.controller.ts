import { Body, Controller, Get, Param, Patch, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  adminUserPatchSchema,
  adminUsersQuerySchema,
  type AdminUserPatch,
  type AdminUsersQuery,
} from '@driftgrid/domain';
import { Roles } from '../auth/access.decorators.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { AdminUsersService } from './admin-users.service.js';
import { IdParamPipe } from '../common/id-param.pipe.js';

@ApiTags('admin')
@ApiBearerAuth()
@Roles('admin')
@Controller('admin/users')
export class AdminUsersController {
  constructor(private readonly service: AdminUsersService) {}

  @Get()
  @ApiOperation({ summary: 'Users, paged; filter by q (e-mail or name) and role' })
  list(@Query(new ZodValidationPipe(adminUsersQuerySchema, 'query')) q: AdminUsersQuery) {
    return this.service.list(q);
  }

  @Patch(':id')
  @ApiOperation({ summary: 'Change a user’s role, active flag or name (the last active admin stays)' })
  @ApiBody({ schema: openApiSchema(adminUserPatchSchema) })
  update(
    @CurrentUser() actor: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Body(new ZodValidationPipe(adminUserPatchSchema)) body: AdminUserPatch,
  ) {
    return this.service.update(actor.id, id, body);
  }
}
