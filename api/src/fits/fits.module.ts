import { Module } from '@nestjs/common';
import { ClockModule } from '../common/clock.js';
import { DatasetsModule } from '../datasets/datasets.module.js';
import { SweepsModule } from '../sweeps/sweeps.module.js';
import { FitRunner } from './fit-runner.js';
import { FitSources } from './fit-sources.js';
import { FitsController } from './fits.controller.js';
import { FitsRepository } from './fits.repository.js';
import { FitsService } from './fits.service.js';

/** Reduced-model fits on sweep results and datasets (SPEC §8): POST/GET /api/fits. */
@Module({
  imports: [SweepsModule, DatasetsModule, ClockModule],
  controllers: [FitsController],
  providers: [FitsRepository, FitsService, FitSources, FitRunner],
  exports: [FitsService],
})
export class FitsModule {}
