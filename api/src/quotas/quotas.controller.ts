import { Body, Controller, Get, Param, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  ROLE_NAMES,
  roleQuotaPatchSchema,
  userQuotaPatchSchema,
  ValidationError,
  type RoleName,
  type RoleQuotaPatch,
  type UserQuotaPatch,
} from '@driftgrid/domain';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { Roles } from '../auth/access.decorators.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { QuotasService } from './quotas.service.js';

function parseRole(role: string): RoleName {
  if ((ROLE_NAMES as readonly string[]).includes(role)) return role as RoleName;
  throw new ValidationError(`Invalid path: role: must be one of ${ROLE_NAMES.join(', ')}`, [
    { path: 'role', message: `must be one of ${ROLE_NAMES.join(', ')}` },
  ]);
}

@ApiTags('admin')
@ApiBearerAuth()
@Roles('admin')
@Controller('admin/quotas')
export class QuotasController {
  constructor(private readonly quotas: QuotasService) {}

  @Get()
  @ApiOperation({ summary: 'Role defaults and per-user overrides' })
  get() {
    return this.quotas.document();
  }

  @Put('roles/:role')
  @ApiOperation({ summary: 'Change some limits of a role default' })
  @ApiBody({ schema: openApiSchema(roleQuotaPatchSchema) })
  putRole(
    @CurrentUser() actor: AuthUser,
    @Param('role') role: string,
    @Body(new ZodValidationPipe(roleQuotaPatchSchema)) body: RoleQuotaPatch,
  ) {
    return this.quotas.setRoleDefault(actor.id, parseRole(role), body);
  }

  @Put('users/:id')
  @ApiOperation({ summary: 'Override some limits for one user; null clears a field (back to the role default)' })
  @ApiBody({ schema: openApiSchema(userQuotaPatchSchema) })
  putUser(
    @CurrentUser() actor: AuthUser,
    @Param('id', new IdParamPipe()) id: number,
    @Body(new ZodValidationPipe(userQuotaPatchSchema)) body: UserQuotaPatch,
  ) {
    return this.quotas.setUserOverride(actor.id, id, body);
  }
}
