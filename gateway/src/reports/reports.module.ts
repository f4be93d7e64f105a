import { Module } from '@nestjs/common';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { ReportBuilder } from './report-builder.service';
import { ReportJobs } from './report-jobs.service';
import { ReportsController } from './reports.controller';
import { RecordSource } from './record-source.service';

/** Event reports for a window: figures from the stored record, PDF, JSON and CSV, built as jobs. */
@Module({
  imports: [ReservoirsModule],
  controllers: [ReportsController],
  providers: [RecordSource, ReportBuilder, ReportJobs],
  exports: [ReportBuilder],
})
export class ReportsModule {}
