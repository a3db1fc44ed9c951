import { Injectable } from '@nestjs/common';
import {
  AMATEUR_BANDS_SOURCE,
  analyseCalibration,
  bandsForRegion,
  dialForFrequency,
  dialForOutput,
  MetrologyError,
  NATIONAL_RULES_NOTE,
  planBands,
  type ItuRegion,
} from '@kilocycle/common/math';
import type { BandPlanResponse, BandPlanSetting } from '@kilocycle/common/types';
import { unitMultiplier } from '@kilocycle/common/units';
import type { AuthUser } from '../shared/auth-user.js';
import type { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { InstrumentsService } from '../instruments/instruments.service.js';
import { RunReadingsReader } from '../readings/run-readings.reader.js';
import { RunContextReader } from '../runs/run-context.reader.js';

type MeasuredPoints = { runId: number; points: Array<{ dial: number; measured: number }> };

@Injectable()
export class BandPlanService {
  constructor(
    private readonly instruments: InstrumentsService,
    private readonly runs: RunContextReader,
    private readonly readings: RunReadingsReader,
  ) {}

  async plan(actor: AuthUser, instrumentId: number, region: ItuRegion, wantedHz: number | undefined): Promise<BandPlanResponse> {
    const instrument = await this.instruments.findVisible(actor, instrumentId);
    const ranges = [...instrument.ranges].sort((a, b) => a.position - b.position);
    const planned = planBands(
      ranges.map((r) => ({ label: r.label, lowHz: r.freqMinHz, highHz: r.freqMaxHz, multipliers: r.multipliers })),
      region,
    );
    // planBands answers one row per range and multiplier, in the order given.
    const rangeOfRow = ranges.flatMap((r) => r.multipliers.map(() => r.id));
    const rows = planned.map((row, index) => ({ ...row, rangeId: rangeOfRow[index]! }));
    const table = { bands: [...bandsForRegion(region)], source: AMATEUR_BANDS_SOURCE, nationalNote: NATIONAL_RULES_NOTE };
    if (wantedHz === undefined) return { instrumentId, region, ...table, rows, wanted: null };

    const settings: BandPlanSetting[] = [];
    for (const range of ranges) {
      let measured: MeasuredPoints | null | undefined;
      for (const multiplier of range.multipliers) {
        const fundamentalHz = wantedHz / multiplier;
        if (fundamentalHz < range.freqMinHz || fundamentalHz > range.freqMaxHz) continue;
        const nominalDial = nominalDialFor(range, fundamentalHz);
        if (nominalDial === null) continue;
        if (measured === undefined) measured = await this.latestMeasuredPoints(range);
        let correctedDial: number | null = null;
        if (measured) {
          try {
            correctedDial = dialForOutput(measured.points, multiplier, wantedHz);
          } catch (error) {
            // Outside the measured span, or a curve that turns: no corrected setting, the nominal stands.
            if (!(error instanceof MetrologyError)) throw error;
          }
        }
        settings.push({
          rangeId: range.id,
          rangeLabel: range.label,
          multiplier,
          fundamentalHz,
          nominalDial,
          correctedDial,
          correctionRunId: correctedDial === null ? null : measured!.runId,
        });
      }
    }
    return { instrumentId, region, ...table, rows, wanted: { outputHz: wantedHz, settings } };
  }

  /** Averaged measured points of the range's latest calibration run that has at least two settings. */
  private async latestMeasuredPoints(range: InstrumentRange): Promise<MeasuredPoints | null> {
    for (const runId of await this.runs.latestCalibrationRunIds(range.id, 5)) {
      const readings = await this.readings.calibrationReadings(runId);
      if (readings.length < 2) continue;
      try {
        const analysis = analyseCalibration({
          law: range.dialLaw,
          readings,
        });
        if (analysis.points.length >= 2) return { runId, points: analysis.points.map((p) => ({ dial: p.dial, measured: p.measured })) };
      } catch (error) {
        if (!(error instanceof MetrologyError)) throw error;
      }
    }
    return null;
  }
}

/** The dial setting the range's law gives for a frequency: a direct dial reads it, a table is read backwards. */
function nominalDialFor(range: InstrumentRange, frequencyHz: number): number | null {
  if (range.dialLaw.kind === 'direct') return frequencyHz / unitMultiplier(range.dialLaw.unit);
  try {
    return dialForFrequency(
      range.dialLaw.points.map((p) => ({ dial: p.dial, measured: p.frequency })),
      frequencyHz,
    );
  } catch (error) {
    if (error instanceof MetrologyError) return null;
    throw error;
  }
}
