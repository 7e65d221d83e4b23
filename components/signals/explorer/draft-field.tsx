import { useEffect, useRef, useState } from 'react';
import { TextField } from '../../forms/text-field';

/**
 * A text field whose value is applied a moment after typing stops, so a query is not sent for
 * every keystroke ("1" on the way to "1m"). The draft follows outside changes (Back, a preset).
 */
export function DraftField({
  label,
  value,
  onCommit,
  error,
  hint,
  placeholder,
  testID,
}: {
  label: string;
  value: string;
  onCommit: (value: string) => void;
  error?: string;
  hint?: string;
  placeholder?: string;
  testID: string;
}) {
  const [draft, setDraft] = useState(value);
  const committed = useRef(value);
  // The latest handler, without restarting the timer when the parent renders a new function.
  const commit = useRef(onCommit);
  commit.current = onCommit;
  useEffect(() => {
    if (value !== committed.current) {
      committed.current = value;
      setDraft(value);
    }
  }, [value]);
  useEffect(() => {
    if (draft === committed.current) return;
    const timer = setTimeout(() => {
      committed.current = draft;
      commit.current(draft);
    }, 600);
    return () => clearTimeout(timer);
  }, [draft]);
  return (
    <TextField
      label={label}
      value={draft}
      onChangeText={setDraft}
      onSubmitEditing={() => {
        committed.current = draft;
        onCommit(draft);
      }}
      error={error}
      hint={hint}
      placeholder={placeholder}
      testID={testID}
      mono
      autoCapitalize="none"
      autoComplete="off"
    />
  );
}
