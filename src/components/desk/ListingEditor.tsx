import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { FormProvider, useForm, useWatch, type FieldErrors, type Path } from 'react-hook-form';
import { api, ApiError } from '../../lib/api-client';
import { STATUS_LABELS, type Category, type ListingStatus } from '../../lib/listings/constants';
import { CATEGORY_FIELDS, toFormValues, type FormValues } from '../../lib/specs';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';
import { BasicsStep } from './BasicsStep';
import { FilesStep } from './FilesStep';
import { LOCKED_STATUSES } from './labels';
import {
  BASICS_FIELDS,
  emptyListingForm,
  formPathOfServerField,
  listingFormSchema,
  listingToForm,
  type ListingFormOutput,
  type ListingFormValues,
} from './listing-form';
import { ListingPreview } from './ListingPreview';
import { SpecFields } from './SpecFields';
import type { DeskFile, DeskListing, LabOption } from './types';
import { useUploads } from './use-uploads';

type Step = 1 | 2 | 3 | 4;
const STEPS: { n: Step; title: string; heading: string }[] = [
  { n: 1, title: 'Basics', heading: 'Category and basics' },
  { n: 2, title: 'Specs', heading: 'Specifications' },
  { n: 3, title: 'Files', heading: 'Photos, datasheet and measurements' },
  { n: 4, title: 'Preview', heading: 'Preview and submit' },
];

const BASIC_LABELS: Record<string, string> = {
  labId: 'Lab',
  category: 'Category',
  title: 'Title',
  description: 'Description',
  condition: 'Condition',
  quantity: 'Quantity',
  price: 'Price',
  currency: 'Currency',
  shipsTo: 'Ships to',
  root: 'Listing',
};

/** What the editor knows of the saved listing. */
interface Saved {
  id: string;
  labId: string;
  version: number;
  status: ListingStatus;
  published: boolean;
  reviewReason: string | null;
}

const savedOf = (l: DeskListing): Saved => ({
  id: l.id,
  labId: l.labId,
  version: l.version,
  status: l.status,
  published: l.published !== null,
  reviewReason: l.reviewReason,
});

const stepOf = (path: string): Step => (path === 'specs' || path.startsWith('specs.') ? 2 : 1);

interface FieldIssue {
  path: string;
  message: string;
}

function flatErrors(errors: FieldErrors, prefix = ''): FieldIssue[] {
  const out: FieldIssue[] = [];
  for (const [key, value] of Object.entries(errors)) {
    if (key === 'ref' || key === 'types' || value === null || typeof value !== 'object') continue;
    const path = prefix === '' ? key : `${prefix}.${key}`;
    const message = (value as { message?: unknown }).message;
    if (typeof message === 'string') out.push({ path, message });
    else out.push(...flatErrors(value as FieldErrors, path));
  }
  return out;
}

const canSubmit = (s: Saved | null) => s === null || s.status === 'draft' || s.status === 'changes-requested';

function StatusNotes({ saved }: { saved: Saved }) {
  return (
    <>
      {saved.status === 'changes-requested' && saved.reviewReason && (
        <div className="notice notice-warn mb-4" data-testid="review-reason">
          <strong>A moderator asks for changes:</strong> {saved.reviewReason}
        </div>
      )}
      {saved.status === 'rejected' && saved.reviewReason && (
        <div className="notice notice-bad mb-4" data-testid="review-reason">
          <strong>Rejected:</strong> {saved.reviewReason}
        </div>
      )}
      {saved.published && !LOCKED_STATUSES.includes(saved.status) && (
        <div className="notice mb-4" data-testid="live-note">
          This listing has an approved version that buyers see. Changes to the title, description, condition, price or specs go back to
          review, and the approved version stays visible until a moderator approves the new one. Stock and shipping regions change at once.
        </div>
      )}
    </>
  );
}

function StepNav({ step, onGo, disabled }: { step: Step; onGo: (s: Step) => void; disabled: boolean }) {
  return (
    <nav aria-label="Steps" className="mb-5">
      <ol className="grid grid-cols-4 gap-1 text-sm">
        {STEPS.map((s) => (
          <li key={s.n}>
            <button
              type="button"
              onClick={() => onGo(s.n)}
              disabled={disabled}
              aria-current={s.n === step ? 'step' : undefined}
              className={`w-full border-b-2 px-1 py-1.5 text-left ${s.n === step ? 'border-accent font-semibold text-ink' : 'border-rule text-ink-soft hover:border-rule-strong'}`}
            >
              <span className="num mr-1 text-ink-faint">
                <span className="sr-only">Step </span>
                {s.n}
              </span>{' '}
              {s.title}
            </button>
          </li>
        ))}
      </ol>
    </nav>
  );
}

function ErrorSummary({ issues, category, onGo }: { issues: FieldIssue[]; category: Category | ''; onGo: (path: string) => void }) {
  if (issues.length === 0) return null;
  const labelOf = (path: string) => {
    if (!path.startsWith('specs.')) return BASIC_LABELS[path] ?? path;
    const key = path.slice('specs.'.length);
    return (category === '' ? undefined : CATEGORY_FIELDS[category].find((f) => f.path === key)?.label) ?? key;
  };
  return (
    <div className="notice notice-bad mb-4" role="alert" data-testid="error-summary">
      <p className="mb-1 font-medium">Fields on other steps need attention:</p>
      <ul className="list-disc pl-5 text-sm">
        {issues.map((i) => (
          <li key={i.path}>
            <button type="button" className="text-left underline" onClick={() => onGo(i.path)}>
              {STEPS[stepOf(i.path) - 1]!.title}: {labelOf(i.path)}
            </button>{' '}
            — {i.message}
          </li>
        ))}
      </ul>
    </div>
  );
}

interface Props {
  listing: DeskListing | null;
  files: DeskFile[];
  labs: LabOption[];
}

function Editor({ listing, files, labs }: Props) {
  const savedRef = useRef<Saved | null>(listing ? savedOf(listing) : null);
  const [saved, setSavedState] = useState<Saved | null>(savedRef.current);
  const setSaved = (s: Saved) => {
    savedRef.current = s;
    setSavedState(s);
  };
  const [step, setStep] = useState<Step>(listing && LOCKED_STATUSES.includes(listing.status) ? 4 : 1);
  const [notice, setNotice] = useState<{ kind: 'good' | 'bad'; text: ReactNode } | null>(null);
  const needsLab = listing === null && labs.length > 1;
  const schema = useMemo(() => listingFormSchema({ needsLab }), [needsLab]);
  const form = useForm<ListingFormValues, unknown, ListingFormOutput>({
    resolver: zodResolver(schema),
    defaultValues: listing ? listingToForm(listing) : emptyListingForm(labs.length === 1 ? labs[0]!.id : ''),
    mode: 'onTouched',
  });
  const uploads = useUploads(saved?.id ?? null, files);
  const category = useWatch({ control: form.control, name: 'category' });
  const locked = saved !== null && LOCKED_STATUSES.includes(saved.status);
  const { isDirty, errors } = form.formState;

  // Switching category swaps in that category's spec fields; what was typed for another category comes back if the seller switches back.
  const specsByCategory = useRef(new Map<Category, FormValues>());
  const shownCategory = useRef<Category | ''>(category);
  useEffect(() => {
    const before = shownCategory.current;
    if (before === category) return;
    if (before !== '') specsByCategory.current.set(before, structuredClone(form.getValues('specs')));
    shownCategory.current = category;
    form.clearErrors('specs');
    form.setValue('specs', category === '' ? {} : (specsByCategory.current.get(category) ?? toFormValues(category, {})));
  }, [category, form]);

  // A field showing an error is checked again as it changes, so the message goes while the seller fixes it
  // (not on blur, where the layout shift would swallow the click on "Next").
  useEffect(() => {
    const sub = form.watch((_values, { name, type }) => {
      if (type !== 'change' || !name) return;
      const parent = name.split('.').slice(0, -1).join('.');
      const withError = [name, parent].find((p) => p !== '' && form.getFieldState(p as Path<ListingFormValues>).error);
      if (withError) void form.trigger(withError as Path<ListingFormValues>);
    });
    return () => sub.unsubscribe();
  }, [form]);

  // Leaving with unsaved typing asks first; a deliberate navigation after saving does not.
  const leaving = useRef(false);
  useEffect(() => {
    if (!isDirty) return;
    const warn = (e: BeforeUnloadEvent) => {
      if (!leaving.current) e.preventDefault();
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [isDirty]);

  const heading = useRef<HTMLHeadingElement>(null);
  const pendingFocus = useRef<string | null>(null);
  const firstRender = useRef(true);
  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    const path = pendingFocus.current;
    pendingFocus.current = null;
    if (path) {
      form.setFocus(`${path}.value` as Path<ListingFormValues>);
      form.setFocus(path as Path<ListingFormValues>);
    } else heading.current?.focus();
  }, [step, form]);

  const saveMutation = useMutation<Saved, ApiError, ListingFormOutput>({
    mutationFn: async (out) => {
      const current = savedRef.current;
      if (current === null) {
        const res = await api<{ id: string; listing: { version: number; status: ListingStatus } }>('/api/listings', {
          body: needsLab ? { ...out.body, labId: out.labId } : out.body,
        });
        return {
          id: res.id,
          labId: out.labId ?? labs[0]?.id ?? '',
          version: res.listing.version,
          status: res.listing.status,
          published: false,
          reviewReason: null,
        };
      }
      const res = await api<{ listing: DeskListing }>(`/api/listings/${encodeURIComponent(current.id)}`, {
        method: 'PATCH',
        body: { ...out.body, version: current.version },
      });
      return savedOf(res.listing);
    },
  });
  const submitMutation = useMutation<unknown, ApiError, string>({
    mutationFn: (id) => api(`/api/listings/${encodeURIComponent(id)}/submit`, { method: 'POST' }),
  });
  const duplicateMutation = useMutation<{ id: string }, ApiError, string>({
    mutationFn: (id) => api(`/api/listings/${encodeURIComponent(id)}/duplicate`, { method: 'POST' }),
    onSuccess: (res) => window.location.assign(`/desk/listings/${encodeURIComponent(res.id)}`),
  });
  const busy = saveMutation.isPending || submitMutation.isPending;

  const showServerError = useCallback(
    (err: unknown) => {
      if (!(err instanceof ApiError)) {
        setNotice({ kind: 'bad', text: 'Something went wrong. Everything you typed is still here; try again.' });
        return;
      }
      const unplaced: string[] = [];
      for (const [key, message] of Object.entries(err.fields ?? {})) {
        const path = formPathOfServerField(key);
        if (path) form.setError(path as Path<ListingFormValues>, { type: 'server', message });
        else unplaced.push(message);
      }
      const kept = 'Everything you typed is still here.';
      const text = err.status === 409 ? `${err.message} ${kept}` : [err.message, ...unplaced, kept].join(' ');
      setNotice({ kind: 'bad', text });
    },
    [form],
  );

  /** Checks everything and saves: POST the first time, then PATCH with the version last seen. */
  const save = async (): Promise<Saved | null> => {
    setNotice(null);
    const holder: { out: ListingFormOutput | null } = { out: null };
    await form.handleSubmit((out) => {
      holder.out = out;
    })();
    if (holder.out === null) {
      setNotice({ kind: 'bad', text: 'Some fields need attention; nothing was saved.' });
      return null;
    }
    const wasNew = savedRef.current === null;
    const wasPublished = savedRef.current?.published === true && savedRef.current.status !== 'in-review';
    try {
      const result = await saveMutation.mutateAsync(holder.out);
      setSaved(result);
      form.reset(form.getValues());
      if (wasNew) window.history.replaceState(null, '', `/desk/listings/${encodeURIComponent(result.id)}`);
      setNotice({
        kind: 'good',
        text:
          wasPublished && result.status === 'in-review'
            ? 'Saved. The changes wait for review; buyers see the approved version until then.'
            : wasNew
              ? 'Saved as a draft. You can add files now.'
              : 'Saved.',
      });
      return result;
    } catch (err) {
      showServerError(err);
      return null;
    }
  };

  const validStep = (s: Step): Promise<boolean> => {
    if (s === 1) return form.trigger([...BASICS_FIELDS]);
    if (s === 2) return form.trigger('specs');
    return Promise.resolve(true);
  };

  const formRef = useRef<HTMLFormElement>(null);
  const focusFirstInvalid = () =>
    requestAnimationFrame(() => formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());

  const goTo = async (target: Step) => {
    if (target <= step) {
      setStep(target);
      return;
    }
    setNotice(null);
    for (let s = step; s < target; s++) {
      if (!(await validStep(s as Step))) {
        setStep(s as Step);
        focusFirstInvalid();
        return;
      }
    }
    // Files belong to a saved listing, so the first visit to the files step saves the draft.
    if (target >= 3 && savedRef.current === null && (await save()) === null) return;
    setStep(target);
  };

  const goToField = (path: string) => {
    pendingFocus.current = path;
    setStep(stepOf(path));
  };

  const submit = async () => {
    const result = await save();
    if (!result) return;
    try {
      await submitMutation.mutateAsync(result.id);
      leaving.current = true;
      window.location.assign(`/desk?submitted=${encodeURIComponent(result.id)}`);
    } catch (err) {
      showServerError(err);
    }
  };

  const otherStepIssues = flatErrors(errors).filter((i) => i.path !== 'root' && stepOf(i.path) !== step);
  const rootError = (errors as { root?: { message?: string } }).root?.message;
  const current = STEPS[step - 1]!;
  const values = form.getValues();
  const preview = step === 4 ? schema.safeParse(values) : null;
  const labName = labs.find((l) => l.id === (saved?.labId ?? values.labId))?.name ?? '';

  return (
    <FormProvider {...form}>
      <div className="mb-4 flex flex-wrap items-baseline gap-x-3 gap-y-1 text-sm">
        <span>
          Status: <strong data-testid="editor-status">{saved ? STATUS_LABELS[saved.status] : 'Not saved yet'}</strong>
        </span>
        {isDirty && <span className="text-ink-faint">· unsaved changes</span>}
      </div>
      {saved && <StatusNotes saved={saved} />}
      {locked && (
        <div className="notice notice-bad mb-4">
          <p className="mb-2">
            A {saved && STATUS_LABELS[saved.status].toLowerCase()} listing cannot be edited. Duplicate it to list the part again.
          </p>
          <button
            type="button"
            className="btn btn-quiet"
            disabled={duplicateMutation.isPending}
            onClick={() => saved && duplicateMutation.mutate(saved.id)}
          >
            Duplicate as a new draft
          </button>
          {duplicateMutation.error && <p className="field-error">{duplicateMutation.error.message}</p>}
        </div>
      )}
      <StepNav step={step} onGo={(s) => void goTo(s)} disabled={busy} />
      <form
        ref={formRef}
        noValidate
        aria-labelledby="step-heading"
        onSubmit={(e) => {
          e.preventDefault();
          if (step < 4) void goTo((step + 1) as Step);
        }}
      >
        <h2 id="step-heading" ref={heading} tabIndex={-1} className="mb-4 text-lg font-semibold outline-none">
          <span className="num text-ink-faint">{step}/4</span> {current.heading}
        </h2>
        {notice && <FormMessage kind={notice.kind}>{notice.text}</FormMessage>}
        {rootError && <FormMessage kind="bad">{rootError}</FormMessage>}
        <ErrorSummary issues={otherStepIssues} category={category} onGo={goToField} />

        {step === 1 && (
          <BasicsStep
            labs={labs}
            fixedCategory={listing ? listing.category : saved ? (category as Category) : null}
            chooseLab={needsLab && saved === null}
          />
        )}
        {step === 2 &&
          (category === '' ? (
            <p className="text-sm">Choose a category in step 1 first.</p>
          ) : (
            <>
              <p className="mb-4 text-sm text-ink-soft">
                Numbers in the unit you have them in; the ± box takes the tolerance in the same unit. Buyers' fit reports use these values.
              </p>
              <SpecFields category={category} />
            </>
          ))}
        {step === 3 && category !== '' && (
          <FilesStep
            category={category}
            items={uploads.items}
            add={uploads.add}
            discard={uploads.discard}
            removing={uploads.removing}
            locked={locked}
          />
        )}
        {step === 4 &&
          (preview?.success ? (
            <ListingPreview body={preview.data.body} labName={labName} files={uploads.items} />
          ) : (
            <p className="text-sm">Some fields need attention before the preview can be shown.</p>
          ))}

        <div className="mt-6 flex flex-wrap items-center gap-3 border-t border-rule pt-4">
          {step > 1 && (
            <button type="button" className="btn btn-quiet" onClick={() => void goTo((step - 1) as Step)} disabled={busy}>
              Back
            </button>
          )}
          <span className="flex-1" />
          {!locked && (
            <button type="button" className="btn btn-quiet" onClick={() => void save()} disabled={busy}>
              {canSubmit(saved) ? 'Save draft' : 'Save changes'}
            </button>
          )}
          {step < 4 && (
            <button type="submit" className="btn btn-primary" disabled={busy}>
              Next: {STEPS[step]!.title}
            </button>
          )}
          {step === 4 && !locked && canSubmit(saved) && (
            <button type="button" className="btn btn-primary" onClick={() => void submit()} disabled={busy}>
              Submit for review
            </button>
          )}
        </div>
      </form>
    </FormProvider>
  );
}

/** The seller's multi-step listing editor: basics, specs, files, preview; saves drafts and submits for review. */
export default function ListingEditor(props: Props) {
  return (
    <QueryRoot>
      <Editor {...props} />
    </QueryRoot>
  );
}
