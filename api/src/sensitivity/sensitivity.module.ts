import { Module } from '@nestjs/common';
import { ReadsModule } from '../reads/reads.module.js';
import { SweepsModule } from '../sweeps/sweeps.module.js';
import { SensitivityController } from './sensitivity.controller.js';
import { SensitivityService } from './sensitivity.service.js';

/** Sobol sensitivity indices of Saltelli-design sweeps (GET /api/sweeps/:id/sensitivity). */
@Module({
  imports: [SweepsModule, ReadsModule],
  controllers: [SensitivityController],
  providers: [SensitivityService],
})
export class SensitivityModule {}
