import { Controller, Get, Param, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { NotFoundError, pageQuerySchema, type PageQuery } from '@driftgrid/domain';
import { Roles } from '../auth/access.decorators.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { MailRepository } from '../mail/mail.repository.js';
import { MailService } from '../mail/mail.service.js';
import { IdParamPipe } from '../common/id-param.pipe.js';

/** The built-in mailbox: messages received by the in-process SMTP server (empty with a real relay). */
@ApiTags('admin')
@ApiBearerAuth()
@Roles('admin')
@Controller('admin/mailbox')
export class MailboxController {
  constructor(
    private readonly repo: MailRepository,
    private readonly mail: MailService,
  ) {}

  @Get()
  @ApiOperation({ summary: 'Messages in the built-in mailbox, newest first, paged' })
  list(@Query(new ZodValidationPipe(pageQuerySchema, 'query')) q: PageQuery) {
    const { items, total } = this.repo.list((q.page - 1) * q.pageSize, q.pageSize);
    return { items, total, page: q.page, pageSize: q.pageSize, builtIn: this.mail.usesBuiltInMailbox };
  }

  @Get(':id')
  @ApiOperation({ summary: 'One message with its text and HTML bodies' })
  get(@Param('id', new IdParamPipe()) id: number) {
    const m = this.repo.get(id);
    if (!m) throw new NotFoundError(`No message with id ${id} in the mailbox`);
    return m;
  }
}
