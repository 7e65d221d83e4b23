import { useEffect, useState } from 'react';
import type { HarImportAnswer } from '../../../hooks/queries/journey-views';
import { useImportedDraft, useJourneyQuery } from '../../../hooks/queries/journeys';
import { useSessionUser } from '../../../hooks/queries/session';
import { NotAllowed } from '../../auth/not-allowed';
import { canWriteJourneys } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { loadJourneySchemas, type JourneySchemas } from '../../forms/journey-schemas';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Screen } from '../../ui/screen';
import { TextLink } from '../../ui/text-link';
import { draftFromDocument, emptyDraft, type JourneyDraft } from './draft';
import JourneyEditorForm from './journey-editor-form';

/** The schemas the form checks with, loaded on first use (they carry the cron parser). */
function useJourneySchemas(): { schemas: JourneySchemas | null; failed: boolean } {
  const [state, setState] = useState<{ schemas: JourneySchemas | null; failed: boolean }>({ schemas: null, failed: false });
  useEffect(() => {
    let live = true;
    loadJourneySchemas().then(
      (schemas) => live && setState({ schemas, failed: false }),
      () => live && setState({ schemas: null, failed: true }),
    );
    return () => {
      live = false;
    };
  }, []);
  return state;
}

export function JourneyEditorScreen({ journeyId, fromImport = false }: { journeyId?: number; fromImport?: boolean }) {
  const journey = useJourneyQuery(journeyId ?? 0);
  const editing = journeyId !== undefined;
  const name = journey.data?.name;
  return (
    <Screen
      title={editing ? `Edit ${name ?? 'journey'}` : fromImport ? 'New journey from a recording' : 'New journey'}
      description="Steps are HTTP requests with checks on each response. Save makes a new version; runs keep the version they ran."
      before={
        editing ? (
          <TextLink href={`/journeys/${journeyId}`} label={`‹ ${name ?? 'Journey'}`} variant="smallStrong" testID="editor-back" />
        ) : (
          <TextLink href="/journeys" label="‹ Journeys" variant="smallStrong" testID="editor-back" />
        )
      }
      testID="journey-editor"
    >
      <EditorContent journeyId={journeyId} fromImport={fromImport} />
    </Screen>
  );
}

function EditorContent({ journeyId, fromImport }: { journeyId?: number; fromImport: boolean }) {
  const user = useSessionUser();
  const journey = useJourneyQuery(journeyId ?? 0);
  const imported = useImportedDraft();
  const { schemas, failed } = useJourneySchemas();
  // The draft is taken once; later refetches of the journey do not overwrite what is being typed.
  const [fresh] = useState<{ draft: JourneyDraft; imported?: HarImportAnswer }>(() =>
    fromImport && imported ? { draft: draftFromDocument(imported.draft), imported } : { draft: emptyDraft() },
  );
  if (!user) return null;
  if (!canWriteJourneys(user)) return <NotAllowed role={user.role} what="Only engineers and admins write journeys." />;

  let initial: JourneyDraft;
  if (journeyId !== undefined) {
    if (journey.isPending) return <Loading label="Loading the journey…" />;
    if (journey.isError) {
      return (
        <Notice tone="bad" title="Could not load the journey">
          {describeError(journey.error, user.role)}
        </Notice>
      );
    }
    initial = draftFromDocument(journey.data.document, journey.data.serviceIds);
  } else {
    initial = fresh.draft;
  }
  return (
    <>
      {fromImport && !imported ? (
        <Notice tone="caution" title="The imported draft is gone">
          It lives only until the page is reloaded. Import the HAR file again, or start from an empty journey below.
        </Notice>
      ) : null}
      {schemas ? (
        <JourneyEditorForm journeyId={journeyId} initial={initial} imported={fresh.imported} schemas={schemas} />
      ) : failed ? (
        <Notice tone="bad" title="The editor could not load">
          Reload the page to try again.
        </Notice>
      ) : (
        <Loading label="Opening the editor…" />
      )}
    </>
  );
}
