import SearchIcon from '@mui/icons-material/Search';
import InputAdornment from '@mui/material/InputAdornment';
import TextField from '@mui/material/TextField';
import { useEffect, useRef, useState } from 'react';
import { useDebouncedValue } from '@/hooks/use-debounced-value';

type SearchFieldProps = { label: string; value: string; onChange: (value: string) => void; placeholder?: string };

/** A search box that reports what was typed once typing pauses. */
export function SearchField({ label, value, onChange, placeholder }: SearchFieldProps) {
  const [text, setText] = useState(value);
  const debounced = useDebouncedValue(text.trim(), 300);
  const lastSent = useRef(value);

  // Follow outside changes (back button, cleared filters).
  useEffect(() => {
    if (value !== lastSent.current) {
      lastSent.current = value;
      setText(value);
    }
  }, [value]);

  useEffect(() => {
    if (debounced !== lastSent.current) {
      lastSent.current = debounced;
      onChange(debounced);
    }
  }, [debounced, onChange]);

  return (
    <TextField
      type="search"
      label={label}
      placeholder={placeholder}
      value={text}
      onChange={(event) => setText(event.target.value)}
      fullWidth={false}
      sx={{ minWidth: 240, flex: '1 1 240px', maxWidth: 360 }}
      slotProps={{
        input: {
          startAdornment: (
            <InputAdornment position="start">
              <SearchIcon fontSize="small" />
            </InputAdornment>
          ),
        },
      }}
    />
  );
}
