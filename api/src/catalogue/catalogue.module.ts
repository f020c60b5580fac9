import { Module } from '@nestjs/common';
import { SweepsModule } from '../sweeps/sweeps.module.js';
import { CatalogueController } from './catalogue.controller.js';
import { CatalogueRepository } from './catalogue.repository.js';
import { CatalogueService } from './catalogue.service.js';
import { DirectoryController } from './directory.controller.js';
import { SeriesRepository } from './series.repository.js';
import { SeriesService } from './series.service.js';

/** The results catalogue: the sweep list, result pages, plot series, sharing and the share directory. */
@Module({
  imports: [SweepsModule],
  controllers: [CatalogueController, DirectoryController],
  providers: [CatalogueRepository, CatalogueService, SeriesRepository, SeriesService],
})
export class CatalogueModule {}
