import { Module } from '@nestjs/common';
import { ClockModule } from '../common/clock.js';
import { DatasetsModule } from '../datasets/datasets.module.js';
import { ReadsModule } from '../reads/reads.module.js';
import { SweepsModule } from '../sweeps/sweeps.module.js';
import { DatasetExportBuilder } from './dataset-export.service.js';
import { Downloads } from './downloads.service.js';
import { DatasetExportController, SweepExportController } from './export.controller.js';
import { ExportRepository } from './export.repository.js';
import { SweepArchiver } from './sweep-archive.service.js';
import { SweepExportBuilder } from './sweep-export.service.js';

/** Zipped-CSV exports of sweeps and datasets, and the archive action that freezes a sweep's export. */
@Module({
  imports: [SweepsModule, DatasetsModule, ClockModule, ReadsModule],
  controllers: [SweepExportController, DatasetExportController],
  providers: [ExportRepository, SweepExportBuilder, DatasetExportBuilder, SweepArchiver, Downloads],
  exports: [SweepExportBuilder, SweepArchiver],
})
export class ExportModule {}
