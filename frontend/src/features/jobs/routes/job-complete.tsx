import '../jobs.css';
import { Link, useNavigate, useParams } from 'react-router';
import { Message } from 'primereact/message';
import { paths } from '@/app/paths';
import { NotFound } from '@/app/routes/not-found';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { useJob } from '../api/get-job';
import { useSurveyComparison } from '../api/get-survey-comparison';
import { CompletionWizard } from '../components/completion-wizard';

export default function JobCompleteRoute() {
  const { jobId = '' } = useParams();
  const navigate = useNavigate();
  const notify = useNotify();
  const job = useJob(jobId);
  const comparison = useSurveyComparison(jobId, { enabled: job.isSuccess });
  if (job.isPending || (job.isSuccess && comparison.isPending)) return <PageLoading label="Loading job" />;
  if (job.isError) {
    if (isApiError(job.error) && (job.error.status === 404 || job.error.status === 400)) return <NotFound />;
    return (
      <div className="page">
        <ApiErrorMessage error={job.error} />
      </div>
    );
  }
  const j = job.data;
  return (
    <div className="page field-page field-page--wide">
      <Link to={paths.jobField.href(j.id)} className="back-link">
        <i className="pi pi-arrow-left" aria-hidden="true" /> {j.number}
      </Link>
      <header className="field-header">
        <p className="field-header__number">Completing {j.number}</p>
        <h1 className="field-header__name">{j.homeownerName}</h1>
        <p className="muted">
          {j.addressLine1}, {j.city}
        </p>
      </header>
      {j.status === 'completed' ? (
        <Message severity="success" className="w-full" text="This job is already completed." />
      ) : j.status !== 'in_progress' ? (
        <Message
          severity="warn"
          className="w-full"
          text="Only a job in progress can be completed: start it first."
        />
      ) : !j.can.complete ? (
        <Message
          severity="info"
          className="w-full"
          text="Only the crew lead on this job or the branch office completes it."
        />
      ) : comparison.isError ? (
        <ApiErrorMessage error={comparison.error} />
      ) : (
        <CompletionWizard
          job={j}
          before={comparison.data!}
          onCancel={() => void navigate(paths.jobField.href(j.id))}
          onCompleted={(done) => {
            notify.success(
              `${done.number} completed`,
              'Thank the homeowner: the office sends the final invoice.',
            );
            void navigate(paths.jobField.href(done.id));
          }}
        />
      )}
    </div>
  );
}
