import { Body, Controller, Get, HttpCode, Param, Post, SetMetadata } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import { SignedIn, WRITE_KEY } from '../auth/access.decorators.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { evaluateRequestSchema, type EvaluateRequest } from './dto/evaluate.dto.js';
import { ModelsService } from './models.service.js';

@ApiTags('models')
@ApiBearerAuth()
@SignedIn()
@Controller('models')
export class ModelsController {
  constructor(private readonly models: ModelsService) {}

  @Get()
  @ApiOperation({ summary: 'Every model with its inputs (unit, default, allowed range, meaning), outputs and flags' })
  list() {
    return this.models.list();
  }

  @Get(':id')
  @ApiOperation({ summary: 'One model registry entry; 404 names the known model ids' })
  detail(@Param('id') id: string) {
    return this.models.detail(id);
  }

  @Post(':id/evaluate')
  @HttpCode(200)
  @ApiOperation({
    summary:
      'Evaluate one point: inputs as numbers (canonical units) or unit strings; missing inputs take the defaults',
  })
  @ApiBody({ schema: openApiSchema(evaluateRequestSchema) })
  // A pure computation that stores nothing, so read-scoped API tokens may call it too.
  @SetMetadata(WRITE_KEY, false)
  evaluate(@Param('id') id: string, @Body(new ZodValidationPipe(evaluateRequestSchema)) body: EvaluateRequest) {
    return this.models.evaluate(id, body);
  }
}
