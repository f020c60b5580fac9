import { Body, Controller, Delete, Get, Param, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import { invitationRequestSchema, pageQuerySchema, type InvitationRequest, type PageQuery } from '@driftgrid/domain';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { Roles } from '../auth/access.decorators.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { InvitationsService } from './invitations.service.js';

@ApiTags('admin')
@ApiBearerAuth()
@Roles('admin')
@Controller('admin/invitations')
export class InvitationsController {
  constructor(private readonly invitations: InvitationsService) {}

  @Post()
  @ApiOperation({ summary: 'Invite an e-mail address with a role (link valid 7 days, single use)' })
  @ApiBody({ schema: openApiSchema(invitationRequestSchema) })
  invite(
    @CurrentUser() actor: AuthUser,
    @Body(new ZodValidationPipe(invitationRequestSchema)) body: InvitationRequest,
  ) {
    return this.invitations.invite(actor, body);
  }

  @Get()
  @ApiOperation({ summary: 'Invitations, newest first, with their status' })
  list(@Query(new ZodValidationPipe(pageQuerySchema, 'query')) q: PageQuery) {
    return this.invitations.list(q);
  }

  @Delete(':id')
  @ApiOperation({ summary: 'Withdraw a pending invitation' })
  revoke(@CurrentUser() actor: AuthUser, @Param('id', new IdParamPipe()) id: number) {
    return this.invitations.revoke(actor, id);
  }
}
