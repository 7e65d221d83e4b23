/** A file the person picked (on the web, the browser's File). */
export type PickedFile = Blob & { name: string };

export interface FileFieldProps {
  label: string;
  /** File types offered by the picker, as in <input accept>. */
  accept: string;
  value: PickedFile | null;
  onChange: (file: PickedFile | null) => void;
  error?: string;
  hint?: string;
  testID: string;
}
