import { Module } from '@nestjs/common';
import { ReadsModule } from '../reads/reads.module.js';
import { SweepsModule } from '../sweeps/sweeps.module.js';
import { CatalogueController } from './catalogue.controller.js';
import { CatalogueRepository } from './catalogue.repository.js';
import { CatalogueService } from './catalogue.service.js';
import { DirectoryController } from './directory.controller.js';

/** The results catalogue: the sweep list, result pages, plot series, sharing and the share directory. */
@Module({
  imports: [SweepsModule, ReadsModule],
  controllers: [CatalogueController, DirectoryController],
  // Plot series (series.service.ts) are computed on the heavy-read pool's threads (api/src/reads).
  providers: [CatalogueRepository, CatalogueService],
})
export class CatalogueModule {}
