import ArrowBack from '@mui/icons-material/ArrowBack';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import { Link as RouterLink, useParams } from 'react-router-dom';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { PageHeader } from '@/components/ui/page-header';
import { instrumentPath } from '@/config/paths';
import { BandPlanner } from '@/features/band-plan/components/band-planner';
import { useInstrument } from '@/features/instruments/api/get-instrument';

export default function BandPlanRoute() {
  const { instrumentId } = useParams();
  const id = Number(instrumentId);
  const instrument = useInstrument({ id });
  if (instrument.isPending) return <FullPageSpinner label="Loading the instrument" />;
  if (instrument.isError) return <Alert severity="info">There is no such instrument, or it is not yours to see.</Alert>;
  const i = instrument.data;
  const dialUnits = Object.fromEntries(i.ranges.map((r) => [r.id, r.dialUnit]));
  return (
    <>
      <Button component={RouterLink} to={instrumentPath(i.id)} size="small" startIcon={<ArrowBack />} sx={{ mb: 1 }}>
        {i.make} {i.model} {i.serial}
      </Button>
      <PageHeader
        title="Band planner"
        description="Which amateur bands each range reaches through the multipliers the owner uses, and the dial setting for a wanted output frequency, corrected by the latest measured points."
      />
      <BandPlanner instrumentId={i.id} dialUnits={dialUnits} />
    </>
  );
}
