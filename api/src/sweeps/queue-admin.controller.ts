import { Controller, Get, HttpCode, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { Roles } from '../auth/access.decorators.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { QueueAdminService } from './queue-admin.service.js';

@ApiTags('admin')
@ApiBearerAuth()
@Controller('admin/queue')
export class QueueAdminController {
  constructor(private readonly queue: QueueAdminService) {}

  @Get()
  @Roles('admin')
  @ApiOperation({ summary: 'Queue mode, job counts by state, paused flag and the sweeps with work outstanding' })
  status() {
    return this.queue.status();
  }

  @Post('pause')
  @HttpCode(200)
  @Roles('admin')
  @ApiOperation({ summary: 'Stop handing out chunk jobs (running chunks finish)' })
  pause(@CurrentUser() user: AuthUser) {
    return this.queue.pause(user.id);
  }

  @Post('resume')
  @HttpCode(200)
  @Roles('admin')
  @ApiOperation({ summary: 'Resume handing out chunk jobs' })
  resume(@CurrentUser() user: AuthUser) {
    return this.queue.resume(user.id);
  }
}
