import Alert from '@mui/material/Alert';

/** Server-side messages shown inside a form, one line each (Nest's validation sends one per field). */
export function FormErrors({ messages }: { messages: readonly string[] }) {
  if (messages.length === 0) return null;
  return (
    <Alert severity="error" role="alert" sx={{ mb: 2 }}>
      {messages.length === 1 ? (
        messages[0]
      ) : (
        <ul style={{ margin: 0, paddingLeft: '1.1rem' }}>
          {messages.map((message) => (
            <li key={message}>{message}</li>
          ))}
        </ul>
      )}
    </Alert>
  );
}
