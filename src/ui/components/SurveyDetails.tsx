/** Site, client and who walked it: the cover of every document. */
import type { Survey } from '../../survey/model.ts';
import { changeFields } from '../../survey/store.ts';
import type { SurveySession } from '../state/session.ts';
import { TextField } from './fields.tsx';

/**
 * Site, client and who walked it.
 *
 * @example <SurveyDetails session={session} survey={survey} /> //=> the details fields
 */
export function SurveyDetails(props: { session: SurveySession; survey: Survey }) {
  const { session, survey } = props;
  return (
    <div class="grid-fields">
      <TextField label="Survey name" value={survey.name} onChange={(name) => session.updateSurvey({ name })} testId="survey-name" />
      <TextField label="Site" value={survey.site.name} onChange={(name) => session.updateSurvey({ site: changeFields<Survey['site']>({ name }) })} />
      <TextField label="Site address" value={survey.site.address} onChange={(address) => session.updateSurvey({ site: changeFields<Survey['site']>({ address }) })} autoComplete="street-address" />
      <TextField label="Client" value={survey.client.name} onChange={(name) => session.updateSurvey({ client: changeFields<Survey['client']>({ name }) })} />
      <TextField label="Client contact" value={survey.client.contact} onChange={(contact) => session.updateSurvey({ client: changeFields<Survey['client']>({ contact }) })} />
      <TextField label="Walked by" value={survey.preparedBy} onChange={(preparedBy) => session.updateSurvey({ preparedBy })} />
      <TextField label="Notes" value={survey.notes} onChange={(notes) => session.updateSurvey({ notes })} multiline class="field--wide" />
    </div>
  );
}
