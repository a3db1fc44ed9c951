import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import type { ReactNode } from 'react';

/**
 * The high-voltage caution. It records; it does not vouch for any procedure. The full text is for capture pages;
 * `compact` is one short paragraph for panels and lists beside the work (alignment, padding, benches), led by a
 * sentence about that task (`children`).
 */
export function SafetyCaution({ compact = false, children }: { compact?: boolean; children?: ReactNode }) {
  return (
    <Alert severity="warning" variant="outlined" role="note" aria-label="Safety caution" sx={{ py: 0.5, '& .MuiAlert-message': { fontSize: '0.8125rem' } }}>
      <AlertTitle sx={{ fontSize: '0.875rem', mb: 0.25 }}>Hazardous voltage inside</AlertTitle>
      {compact ? (
        <>
          {children ? <>{children} </> : null}
          Much of this equipment holds hundreds of volts, and filter capacitors keep their charge after switch-off. Follow your local electrical codes and
          licensed practice. Kilocycle does not judge whether a procedure is safe.
        </>
      ) : (
        <>
          {children ? <>{children} </> : null}
          Much of this equipment holds hundreds of volts, and filter capacitors keep their charge after switch-off: discharge them, keep one hand out of the
          chassis, and work through an isolation transformer. Follow your local electrical codes and licensed practice. Tests on the air need the operator’s
          licence and a clean signal. Kilocycle records measurements; it does not judge whether a procedure is safe.
        </>
      )}
    </Alert>
  );
}
