import { Module } from '@nestjs/common';
import { StorageModule } from '../storage/storage.module';
import { InspectionPhotosController } from './inspection-photos.controller';
import { InspectionPhotosRepository } from './inspection-photos.repository';
import { InspectionPhotosService } from './inspection-photos.service';
import { InspectionsController } from './inspections.controller';
import { InspectionsRepository } from './inspections.repository';
import { InspectionsService } from './inspections.service';

@Module({
  imports: [StorageModule],
  controllers: [InspectionsController, InspectionPhotosController],
  providers: [InspectionsRepository, InspectionsService, InspectionPhotosRepository, InspectionPhotosService],
  exports: [InspectionsService],
})
export class InspectionsModule {}
