import { Module } from '@nestjs/common';
import { ModelsController } from './models.controller.js';
import { ModelsService } from './models.service.js';

/** The model registry over HTTP: list, detail and one-point evaluation (SPEC §6). */
@Module({ controllers: [ModelsController], providers: [ModelsService], exports: [ModelsService] })
export class ModelsModule {}
