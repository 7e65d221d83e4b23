export interface SelectOption<V extends string> {
  value: V;
  label: string;
}

export interface SelectFieldProps<V extends string> {
  /** Visible label; omitted inside table rows, where the column names it (accessibilityLabel still required). */
  label?: string;
  accessibilityLabel: string;
  value: V;
  options: readonly SelectOption<V>[];
  onChange: (value: V) => void;
  disabled?: boolean;
  error?: string;
  hint?: string;
  testID: string;
  compact?: boolean;
}
