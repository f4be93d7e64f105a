import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Reservoir } from './reservoir.entity';
import { ReservoirVersion } from './reservoir-version.entity';
import { DefinitionUploadService } from './definition-upload.service';
import { LimitsChangeService } from './limits-change.service';
import { ReservoirsController } from './reservoirs.controller';
import { ReservoirsService } from './reservoirs.service';

@Module({
  imports: [TypeOrmModule.forFeature([Reservoir, ReservoirVersion])],
  controllers: [ReservoirsController],
  providers: [ReservoirsService, DefinitionUploadService, LimitsChangeService],
  exports: [ReservoirsService],
})
export class ReservoirsModule {}
