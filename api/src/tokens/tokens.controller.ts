import { Body, Controller, Delete, Get, Param, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  createTokenSchema,
  noQuerySchema,
  pageQuerySchema,
  type CreateTokenParsed,
  type PageQuery,
} from '@driftgrid/domain';
import { IdParamPipe } from '../common/id-param.pipe.js';
import { SignedIn } from '../auth/access.decorators.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { TokensService } from './tokens.service.js';

@ApiTags('tokens')
@ApiBearerAuth()
@SignedIn()
@Controller('tokens')
export class TokensController {
  constructor(private readonly tokens: TokensService) {}

  @Post()
  @ApiOperation({ summary: 'Create a personal API token; the secret is in this response only' })
  @ApiBody({ schema: openApiSchema(createTokenSchema) })
  create(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(createTokenSchema)) body: CreateTokenParsed) {
    return this.tokens.create(user, body);
  }

  @Get()
  @ApiOperation({ summary: 'Your tokens (no secrets), newest first' })
  list(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(pageQuerySchema, 'query')) q: PageQuery) {
    return this.tokens.list(user, q);
  }

  @Get('active')
  @ApiOperation({ summary: 'How many of your tokens are active (not revoked, not expired)' })
  active(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(noQuerySchema, 'query')) _q: object) {
    return this.tokens.activeCount(user);
  }

  @Delete(':id')
  @ApiOperation({ summary: 'Revoke one of your tokens' })
  revoke(@CurrentUser() user: AuthUser, @Param('id', new IdParamPipe()) id: number) {
    return this.tokens.revoke(user, id);
  }
}
