import { useState } from 'react';
import { View } from 'react-native';
import { isApiError } from '../../../hooks/api-client';
import { useSessionUser } from '../../../hooks/queries/session';
import { useCsvImportMutation, useCsvPreviewMutation } from '../../../hooks/queries/signals';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { csvMappingSchema, type CsvMapping } from '../../../shared/schemas/signals';
import { NotAllowed } from '../../auth/not-allowed';
import { describeError } from '../../format/describe-error';
import { checkForm, type FieldErrors } from '../../forms/field-errors';
import { FileField } from '../../forms/file-field';
import type { PickedFile } from '../../forms/file-field.types';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Notice } from '../../ui/notice';
import { Screen } from '../../ui/screen';
import { Text } from '../../ui/text';
import { TextLink } from '../../ui/text-link';
import { explorerHref } from '../explorer/explorer-params';
import { canWriteSignals } from '../roles';
import { draftToMapping, initialDraft, type MappingDraft } from './csv-draft';
import { CsvMappingForm, type MappingField } from './csv-mapping-form';
import { CsvPreviewTable } from './csv-preview-table';
import { CsvReport } from './csv-report';

export function CsvUploadScreen() {
  return (
    <Screen
      title="Upload metric CSV"
      description="Past samples from a spreadsheet or another tool: one row per sample, a header row first. Good rows are kept and bad ones reported by row; uploading the same file again stores nothing twice."
      before={<TextLink href="/signals" label="‹ Services" variant="smallStrong" testID="csv-back" />}
      testID="csv-upload"
    >
      <CsvUploadFlow />
    </Screen>
  );
}

const MAPPING_FIELDS: readonly MappingField[] = ['time', 'value', 'service', 'signal', 'kind', 'unit', 'labels'];

function CsvUploadFlow() {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  const user = useSessionUser();
  const preview = useCsvPreviewMutation();
  const importer = useCsvImportMutation();
  const [file, setFile] = useState<PickedFile | null>(null);
  const [fileError, setFileError] = useState<string | undefined>(undefined);
  const [draft, setDraft] = useState<MappingDraft | null>(null);
  const [errors, setErrors] = useState<FieldErrors<MappingField>>({});
  const [progress, setProgress] = useState(0);
  const [sent, setSent] = useState<CsvMapping | null>(null);
  if (!user) return null;
  if (!canWriteSignals(user)) return <NotAllowed role={user.role} what="Only engineers and admins upload metric CSV files." />;

  const choose = (f: PickedFile | null) => {
    setFile(f);
    setFileError(undefined);
    setDraft(null);
    setErrors({});
    preview.reset();
    importer.reset();
  };

  const read = () => {
    if (!file) {
      setFileError('Choose a .csv file first.');
      return;
    }
    preview.mutate(file, {
      onSuccess: (p) => setDraft(initialDraft(p)),
      onError: (error) => {
        if (isApiError(error) && error.field === 'file') setFileError(error.message);
      },
    });
  };

  const upload = () => {
    if (!file || !draft) return;
    const checked = checkForm(csvMappingSchema, draftToMapping(draft));
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    setProgress(0);
    setSent(checked.data);
    importer.mutate(
      { file, mapping: checked.data, onProgress: setProgress },
      {
        onError: (error) => {
          // The server names the mapping field it refused ("mapping.signal.column").
          const field = isApiError(error) && error.field?.startsWith('mapping.') ? (error.field.split('.')[1] as MappingField) : null;
          if (field && MAPPING_FIELDS.includes(field)) setErrors({ [field]: error.message.replace(/^mapping\.[\w.]+: /, '') });
          else if (isApiError(error) && error.field === 'file') setFileError(error.message);
        },
      },
    );
  };

  const fileCard = (
    <Card title="1. File" testID="csv-file-card">
      <FileField
        label="CSV file"
        accept=".csv,.tsv,.txt,text/csv"
        value={file}
        onChange={choose}
        error={fileError}
        hint="Commas, semicolons or tabs; quoted cells as in RFC 4180. Up to 100 MiB."
        testID="csv-file"
      />
      {preview.isError && !fileError ? <Notice tone="bad">{describeError(preview.error, user.role)}</Notice> : null}
      <Button label="Read the columns" kind={draft ? 'secondary' : 'primary'} icon="file-text" onPress={read} busy={preview.isPending} testID="csv-read" />
    </Card>
  );

  const previewCard = preview.data ? (
    <Card title="2. What the file holds" testID="csv-preview">
      <CsvPreviewTable preview={preview.data} />
    </Card>
  ) : null;

  const mappingCard =
    preview.data && draft ? (
      <Card title="3. Map the columns" description="Time and value come from columns; service, signal and kind from a column or the same for every row. Checked columns become labels." testID="csv-mapping">
        <CsvMappingForm columns={preview.data.columns} draft={draft} onChange={setDraft} errors={errors} twoColumns={isWide} />
        {importer.isError && !Object.keys(errors).length && !fileError ? <Notice tone="bad">{describeError(importer.error, user.role)}</Notice> : null}
        <Button label="Import" kind="primary" icon="upload" onPress={upload} busy={importer.isPending} testID="csv-import" />
      </Card>
    ) : null;

  const resultCard =
    importer.isPending || importer.data ? (
      <Card title="4. Result" testID="csv-result">
        {importer.isPending ? <Progress share={progress} /> : null}
        {importer.data ? <CsvReport result={importer.data} /> : null}
        {importer.data && sent?.service.value && sent.signal.value ? (
          <TextLink href={explorerHref(sent.service.value, sent.signal.value)} label={`Explore ${sent.signal.value}`} variant="smallStrong" testID="csv-explore" />
        ) : importer.data ? (
          <TextLink href="/signals" label="See the services" variant="smallStrong" testID="csv-services" />
        ) : null}
      </Card>
    ) : null;

  // Wide: the file beside what it holds, then the mapping across the width with the result right
  // under its Import button.
  if (isWide) {
    return (
      <View style={{ gap: theme.space.xl }}>
        <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
          <View style={{ width: theme.sizes.editorAsideWidth }}>{fileCard}</View>
          <View style={{ flex: 1 }}>{previewCard}</View>
        </View>
        {mappingCard}
        {resultCard}
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.lg }}>
      {fileCard}
      {previewCard}
      {mappingCard}
      {resultCard}
    </View>
  );
}

/** Bytes sent so far; the server stores rows while they arrive, so this is the import's progress too. */
function Progress({ share }: { share: number }) {
  const theme = useTheme();
  const c = theme.colors;
  const percent = Math.round(share * 100);
  return (
    <View testID="csv-progress" accessibilityRole="progressbar" accessibilityValue={{ min: 0, max: 100, now: percent }} style={{ gap: theme.space.sm }}>
      <View style={{ height: theme.sizes.waterfallBar, borderRadius: theme.radii.pill, backgroundColor: c.sunken, overflow: 'hidden' }}>
        <View style={{ width: `${percent}%`, height: '100%', backgroundColor: c.accent }} />
      </View>
      <Text variant="small" tone="muted">
        {percent < 100 ? (
          <>
            {'Sending and storing rows… '}
            <Text variant="numberSmall" tone="muted">{`${percent} %`}</Text>
          </>
        ) : (
          'Sent; storing the last rows…'
        )}
      </Text>
    </View>
  );
}
