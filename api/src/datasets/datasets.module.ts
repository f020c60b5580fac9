import { Module } from '@nestjs/common';
import { ClockModule } from '../common/clock.js';
import { ReadsModule } from '../reads/reads.module.js';
import { CsvUploadInterceptor } from './csv-upload.interceptor.js';
import { DatasetsController } from './datasets.controller.js';
import { DatasetsRepository } from './datasets.repository.js';
import { DatasetsService } from './datasets.service.js';

/** Uploaded measurements. Exports DatasetsService (readable, columns, series) for fits and plots. */
@Module({
  imports: [ClockModule, ReadsModule],
  controllers: [DatasetsController],
  providers: [DatasetsRepository, DatasetsService, CsvUploadInterceptor],
  exports: [DatasetsService, DatasetsRepository],
})
export class DatasetsModule {}
