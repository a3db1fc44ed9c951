import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Link from '@mui/material/Link';
import MenuItem from '@mui/material/MenuItem';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { Link as RouterLink, useSearchParams } from 'react-router-dom';
import { ITU_REGION_NAMES, ITU_REGIONS_WITH_BANDS, type ItuRegion } from '@kilocycle/common/math';
import { parseFrequency } from '@kilocycle/common/units';
import { Num, numberSx } from '@/components/ui/num';
import { runPath } from '@/config/paths';
import { useDebouncedValue } from '@/hooks/use-debounced-value';
import { ApiError } from '@/lib/api-client';
import { formatHz, formatHzShort, formatNumber } from '@/utils/frequency';
import type { BandPlanResponse } from '@kilocycle/common/types';
import { useBandPlan } from '../api/get-band-plan';

function readWanted(text: string): { hz: number | null; error: string | null } {
  if (!text.trim()) return { hz: null, error: null };
  try {
    return { hz: parseFrequency(text, 'Hz'), error: null };
  } catch (error) {
    return { hz: null, error: error instanceof Error ? error.message : String(error) };
  }
}

/** An instrument's ranges × output multipliers against the amateur bands, and the dial setting for a wanted frequency. */
export function BandPlanner({ instrumentId, dialUnits }: { instrumentId: number; dialUnits: Record<number, string> }) {
  // The regions offered are the ones with a band table; the choice stays in the address (?region=1).
  const [params, setParams] = useSearchParams();
  const asked = Number(params.get('region'));
  const region: ItuRegion = ITU_REGIONS_WITH_BANDS.find((r) => r === asked) ?? (ITU_REGIONS_WITH_BANDS.includes(2) ? 2 : ITU_REGIONS_WITH_BANDS[0]!);
  const setRegion = (next: ItuRegion) =>
    setParams(
      (current) => {
        const updated = new URLSearchParams(current);
        updated.set('region', String(next));
        return updated;
      },
      { replace: true },
    );
  const [wantedText, setWantedText] = useState('');
  const wanted = readWanted(useDebouncedValue(wantedText, 300));
  const typed = readWanted(wantedText);
  const plan = useBandPlan({ instrumentId, query: { region, ...(wanted.hz ? { wantedHz: wanted.hz } : {}) } });
  const problem = plan.error instanceof ApiError ? plan.error.message : plan.error ? 'The band plan could not be loaded.' : null;

  return (
    <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: 'minmax(0, 1fr)' }}>
      <Paper variant="outlined" sx={{ p: 2 }}>
        <Box sx={{ display: 'flex', gap: 2, flexWrap: 'wrap', alignItems: 'flex-start' }}>
          <TextField
            select
            label="ITU region"
            value={region}
            onChange={(e) => setRegion(Number(e.target.value) as ItuRegion)}
            fullWidth={false}
            sx={{ width: { xs: '100%', sm: 340 } }}
            helperText="Band edges of the ITU table for this region"
          >
            {ITU_REGIONS_WITH_BANDS.map((r) => (
              <MenuItem key={r} value={r}>
                {ITU_REGION_NAMES[r]}
              </MenuItem>
            ))}
          </TextField>
          <TextField
            label="Wanted output frequency"
            placeholder="14.2 MHz"
            value={wantedText}
            onChange={(e) => setWantedText(e.target.value)}
            fullWidth={false}
            sx={{ width: { xs: '100%', sm: 320 } }}
            error={Boolean(typed.error)}
            helperText={typed.error ?? (typed.hz ? `= ${formatHz(typed.hz)}` : 'With its unit: 14.2 MHz, 7050 kHz; a bare number is Hz')}
            slotProps={{ htmlInput: { style: { fontFamily: numberSx.fontFamily } } }}
          />
        </Box>
        {problem && (
          <Alert severity="warning" sx={{ mt: 1 }}>
            {problem}
          </Alert>
        )}
        <Alert severity="info" role="note" aria-label="About the band edges" sx={{ mt: 1.5 }}>
          Band edges are a reference: what you may transmit, and where, depends on your licence and your local rules.
          {plan.data && <> Source: {plan.data.source}.</>}
        </Alert>
      </Paper>

      {plan.data?.wanted && (
        <Paper variant="outlined" sx={{ p: 2 }}>
          <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
            Dial setting for <Num>{formatHz(plan.data.wanted.outputHz)}</Num>
          </Typography>
          {plan.data.wanted.settings.length === 0 ? (
            <Typography variant="body2" color="text.secondary">
              No range and multiplier of this instrument reaches that frequency.
            </Typography>
          ) : (
            <Box sx={{ overflowX: 'auto' }}>
              <Table size="small" aria-label="Dial settings for the wanted frequency">
                <TableHead>
                  <TableRow>
                    <TableCell>Range</TableCell>
                    <TableCell align="right">Multiplier</TableCell>
                    <TableCell align="right">Fundamental</TableCell>
                    <TableCell align="right">Dial by its marks</TableCell>
                    <TableCell align="right">Corrected dial</TableCell>
                    <TableCell>From</TableCell>
                  </TableRow>
                </TableHead>
                <TableBody>
                  {plan.data.wanted.settings.map((s) => (
                    <TableRow key={`${s.rangeId}-${s.multiplier}`}>
                      <TableCell sx={{ whiteSpace: 'pre' }}>{s.rangeLabel}</TableCell>
                      <TableCell align="right">
                        <Num>×{s.multiplier}</Num>
                      </TableCell>
                      <TableCell align="right">
                        <Num>{formatHz(s.fundamentalHz)}</Num>
                      </TableCell>
                      <TableCell align="right">
                        <Num>
                          {formatNumber(s.nominalDial, 3)} {dialUnits[s.rangeId] ?? ''}
                        </Num>
                      </TableCell>
                      <TableCell align="right">
                        <Num sx={{ fontWeight: 600 }}>
                          {s.correctedDial === null ? '—' : `${formatNumber(s.correctedDial, 3)} ${dialUnits[s.rangeId] ?? ''}`}
                        </Num>
                      </TableCell>
                      <TableCell>
                        {s.correctionRunId ? (
                          <Link component={RouterLink} to={runPath(s.correctionRunId)}>
                            measured points of run #{s.correctionRunId}
                          </Link>
                        ) : (
                          <Typography variant="body2" color="text.secondary" component="span">
                            no calibration run covers it
                          </Typography>
                        )}
                      </TableCell>
                    </TableRow>
                  ))}
                </TableBody>
              </Table>
            </Box>
          )}
        </Paper>
      )}

      <Paper variant="outlined" sx={{ p: 2 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Ranges and bands
        </Typography>
        {!plan.data ? (
          <Typography variant="body2" color="text.secondary">
            {plan.isPending ? 'Loading…' : '—'}
          </Typography>
        ) : plan.data.rows.length === 0 ? (
          <Typography variant="body2" color="text.secondary">
            The instrument has no ranges yet.
          </Typography>
        ) : (
          <Box sx={{ overflowX: 'auto' }}>
            <Table size="small" aria-label="Band plan">
              <TableHead>
                <TableRow>
                  <TableCell>Range</TableCell>
                  <TableCell align="right">Multiplier</TableCell>
                  <TableCell align="right">Output span</TableCell>
                  <TableCell>Amateur bands covered</TableCell>
                </TableRow>
              </TableHead>
              <TableBody>
                {plan.data.rows.map((row) => (
                  <TableRow key={`${row.rangeId}-${row.multiplier}`} hover>
                    <TableCell sx={{ whiteSpace: 'pre' }}>{row.rangeLabel}</TableCell>
                    <TableCell align="right">
                      <Num>×{row.multiplier}</Num>
                    </TableCell>
                    <TableCell align="right">
                      <Num>
                        {formatHz(row.outLowHz)} – {formatHz(row.outHighHz)}
                      </Num>
                    </TableCell>
                    <TableCell>
                      {row.bands.length === 0 ? (
                        <Typography variant="body2" color="text.secondary" component="span">
                          none
                        </Typography>
                      ) : (
                        <Box sx={{ display: 'flex', gap: 0.5, flexWrap: 'wrap' }}>
                          {row.bands.map((band) => (
                            <Chip
                              key={band.name}
                              size="small"
                              color={band.full ? 'success' : 'default'}
                              variant={band.full ? 'filled' : 'outlined'}
                              label={
                                band.full
                                  ? `${band.name} whole band`
                                  : `${band.name} part: ${formatHzShort(band.coveredLowHz)} – ${formatHzShort(band.coveredHighHz)}`
                              }
                              sx={{ height: 22, fontSize: '0.75rem', fontFamily: numberSx.fontFamily }}
                            />
                          ))}
                        </Box>
                      )}
                    </TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </Box>
        )}
      </Paper>

      {plan.data && <RegionBands region={plan.data.region} bands={plan.data.bands} nationalNote={plan.data.nationalNote} />}
    </Box>
  );
}

/** Columns shown from the small breakpoint up; on a phone their content folds into the first cell. */
const wide = { display: { xs: 'none', sm: 'table-cell' } } as const;

/** Band edges as the ITU table prints them: kHz, a decimal only where there is one (5 351.5). */
const kHz = (hz: number) => formatNumber(hz / 1000, Number.isInteger(hz / 1000) ? 0 : 1);

/** The region's band table the plan used: edges, the amateur service's status and the allocation's note. */
function RegionBands({ region, bands, nationalNote }: { region: ItuRegion; bands: BandPlanResponse['bands']; nationalNote: string }) {
  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 0.5 }}>
        Amateur bands, ITU Region {region}
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
        {nationalNote}
      </Typography>
      <Box sx={{ overflowX: 'auto' }}>
        <Table size="small" aria-label={`Amateur bands of ITU Region ${region}`}>
          <TableHead>
            <TableRow>
              <TableCell>Band</TableCell>
              <TableCell align="right">Edges</TableCell>
              <TableCell sx={wide}>Amateur service</TableCell>
              <TableCell sx={wide}>Note</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {bands.map((band) => (
              <TableRow key={band.name}>
                <TableCell>
                  <Box component="span" sx={{ whiteSpace: 'nowrap' }}>
                    {band.name}
                  </Box>
                  {/* On a phone the status and the note fold under the band's name. */}
                  <Typography variant="caption" color="text.secondary" component="span" sx={{ display: { xs: 'block', sm: 'none' } }}>
                    {band.status}
                    {band.note ? ` · ${band.note}` : ''}
                  </Typography>
                </TableCell>
                <TableCell align="right" sx={{ whiteSpace: 'nowrap', verticalAlign: 'top' }}>
                  <Num>
                    {kHz(band.lowHz)} – {kHz(band.highHz)} kHz
                  </Num>
                </TableCell>
                <TableCell sx={wide}>{band.status}</TableCell>
                <TableCell sx={wide}>
                  <Typography variant="body2" component="span" color={band.note ? 'text.primary' : 'text.secondary'}>
                    {band.note ?? '—'}
                  </Typography>
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>
    </Paper>
  );
}
