import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One live forecast run as it was pushed to consoles, never changed once written (triggers refuse
 * UPDATE and DELETE), so that a reviewer sees what operators saw at each moment. The summary
 * columns serve the run list without reading the JSON; the JSON columns hold everything else.
 */
@Entity('forecast_runs')
@Index('ix_forecast_runs_time', ['reservoirId', 'computedAt'])
export class ForecastRunRow {
  @PrimaryGeneratedColumn()
  id: number;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  /** site time of the run, epoch ms */
  @Column('integer', { name: 'computed_at' })
  computedAt: number;

  /** gateway wall clock when stored, epoch ms */
  @Column('integer', { name: 'stored_at' })
  storedAt: number;

  @Column('text')
  trigger: string;

  @Column('text', { name: 'trigger_detail' })
  triggerDetail: string;

  @Column('integer', { name: 'definition_version' })
  definitionVersion: number;

  /** { gateway, options } as JSON */
  @Column('text', { name: 'code_version' })
  codeVersion: string;

  @Column('real', { name: 'start_elevation' })
  startElevation: number;

  @Column('real', { name: 'peak_elevation' })
  peakElevation: number;

  @Column('integer', { name: 'peak_time' })
  peakTime: number;

  @Column('real', { name: 'peak_p90' })
  peakP90: number;

  @Column('text', { name: 'time_left_status' })
  timeLeftStatus: string;

  @Column('integer', { name: 'latest_start', nullable: true })
  latestStart: number | null;

  /** ForecastInputs as JSON */
  @Column('text')
  inputs: string;

  /** series, peak, thresholds, notes, durationMs as JSON */
  @Column('text')
  outputs: string;

  /** timeLeft and holdNow as JSON */
  @Column('text')
  decisions: string;
}
