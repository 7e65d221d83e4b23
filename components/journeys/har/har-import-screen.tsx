import { router } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import { isApiError } from '../../../hooks/api-client';
import { useImportHarMutation } from '../../../hooks/queries/journeys';
import { useSessionUser } from '../../../hooks/queries/session';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import { NotAllowed } from '../../auth/not-allowed';
import { canWriteJourneys } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { FileField } from '../../forms/file-field';
import type { PickedFile } from '../../forms/file-field.types';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Card } from '../../ui/card';
import { Notice } from '../../ui/notice';
import { Screen } from '../../ui/screen';
import { Text } from '../../ui/text';
import { TextLink } from '../../ui/text-link';
import { HarEntries } from './har-entries';

export function HarImportScreen() {
  return (
    <Screen
      title="Import a HAR file"
      description="Record the walk in your browser (developer tools, Network, Save all as HAR), then upload it here. Pages and API calls become steps; static files are left out; credentials become secrets."
      before={<TextLink href="/journeys" label="‹ Journeys" variant="smallStrong" testID="har-back" />}
      testID="har-import"
    >
      <HarImportContent />
    </Screen>
  );
}

function HarImportContent() {
  const theme = useTheme();
  const { isRoomy } = useBreakpoints();
  const user = useSessionUser();
  const upload = useImportHarMutation();
  const [file, setFile] = useState<PickedFile | null>(null);
  const [name, setName] = useState('');
  const [fileError, setFileError] = useState<string | undefined>(undefined);
  if (!user) return null;
  if (!canWriteJourneys(user)) return <NotAllowed role={user.role} what="Only engineers and admins import journeys." />;

  const submit = () => {
    setFileError(undefined);
    if (!file) {
      setFileError('Choose a .har file first.');
      return;
    }
    const form = new FormData();
    form.append('file', file, file.name);
    if (name.trim()) form.append('name', name.trim());
    upload.mutate(form, {
      onError: (error) => {
        if (isApiError(error) && error.field === 'file') setFileError(error.message.replace(/^file: /, ''));
      },
    });
  };

  const result = upload.data;
  const kept = result?.entries.filter((e) => e.kept).length ?? 0;
  const form = (
    <Card title="Recording" testID="har-form">
      <FileField
        label="HAR file"
        accept=".har,application/json"
        value={file}
        onChange={(f) => {
          setFile(f);
          setFileError(undefined);
        }}
        error={fileError}
        hint="HAR 1.2, at most 20 MiB."
        testID="har-file"
      />
      <TextField label="Journey name (optional)" hint="Otherwise the recorded page title." value={name} onChangeText={setName} testID="har-name" />
      {upload.isError && !fileError ? <Notice tone="bad">{describeError(upload.error, user.role)}</Notice> : null}
      <Button label="Read the recording" kind="primary" icon="upload" onPress={submit} busy={upload.isPending} testID="har-upload" />
      <Text variant="caption" tone="faint">
        Passwords, cookies and tokens in the file are stored encrypted as secrets at once; the draft only names them.
      </Text>
    </Card>
  );
  const preview = result ? (
    <Card
      title="What the recording holds"
      description={`${kept} of ${result.entries.length} requests become steps. Nothing is saved until you save the journey in the editor.`}
      testID="har-preview"
    >
      {result.secrets.length > 0 ? (
        <Notice tone="caution" title={`${result.secrets.length} credential${result.secrets.length === 1 ? '' : 's'} stored as secrets`} testID="har-secrets">
          <View style={{ gap: theme.space.xxs }}>
            {result.secrets.map((s) => (
              <Text key={s.name} variant="small">
                <Text variant="numberSmall">{s.name}</Text>
                {` from ${s.source}`}
              </Text>
            ))}
          </View>
        </Notice>
      ) : null}
      {result.warnings.length > 0 ? (
        <Notice tone="info" title="Worth knowing">
          <View style={{ gap: theme.space.xxs }}>
            {result.warnings.map((w) => (
              <Text key={w} variant="small">
                {w}
              </Text>
            ))}
          </View>
        </Notice>
      ) : null}
      <HarEntries entries={result.entries} />
      <Button label="Open the draft in the editor" kind="primary" icon="edit-2" onPress={() => router.push('/journeys/new?from=har')} disabled={kept === 0} testID="har-open-draft" />
    </Card>
  ) : null;

  if (isRoomy) {
    return (
      <View style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.xl }}>
        <View style={{ width: theme.sizes.editorAsideWidth }}>{form}</View>
        <View style={{ flex: 1 }}>{preview}</View>
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.lg }}>
      {form}
      {preview}
    </View>
  );
}
