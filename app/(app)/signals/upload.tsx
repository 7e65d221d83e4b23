import { CsvUploadScreen } from '../../../components/signals/lazy-screens';

export default function CsvUploadRoute() {
  return <CsvUploadScreen />;
}
