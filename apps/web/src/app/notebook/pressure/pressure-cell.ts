import { ReadablePipe } from '../../shared/readable';
import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, ElementRef, PendingTasks, computed, inject, input, signal, viewChild } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { binaryTableFault } from '@laminote/aero/pressure-table';
import type { DraftCell, PressureResult } from '@laminote/contracts';
import { UPLOAD_LIMIT_BYTES } from '@laminote/contracts/limits';
import { problemMessage, toProblem } from '../../core/problem';
import { Plot } from '../../shared/plot';
import { CellResult, shownResult } from '../cell-result';
import { DraftSession } from '../../shared/draft-session';
import { NotebookApi } from '../../shared/notebook-api';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { EMPTY_PREVIEW, resultFigure, resultStagnation, slopeFigure } from './cp-preview';

type Layout = 'closedLoop' | 'surface';
type Smoothing = 'off' | 'auto' | 'width';

interface PressureFormValue {
  text: string;
  layout: Layout;
  surfaceName: string;
  hasRadius: boolean;
  smoothing: Smoothing;
  smoothingHalfWidth: string;
}

/** A problem as the cell lists it: the line it is on (0 for the table as a whole) and what is wrong. */
interface LineProblem {
  readonly line: number;
  readonly message: string;
}

/**
 * Pressure distribution: a Cp table pasted or uploaded, kept exactly as given. It is read as it is
 * typed with the engine's reader, its problems listed by line, and plotted with negative Cp up.
 */
@Component({
  selector: 'lam-pressure-cell',
  imports: [
    ReadablePipe,
    CellResult,
    DecimalPipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSlideToggleModule,
    Plot,
    ReactiveFormsModule,
  ],
  templateUrl: './pressure-cell.html',
  styleUrl: './pressure-cell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PressureCell {
  private readonly api = inject(NotebookApi);
  protected readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();

  protected readonly form = new FormGroup({
    text: new FormControl('', { nonNullable: true }),
    layout: new FormControl<Layout>('closedLoop', { nonNullable: true }),
    surfaceName: new FormControl('upper', { nonNullable: true }),
    hasRadius: new FormControl(false, { nonNullable: true }),
    smoothing: new FormControl<Smoothing>('auto', { nonNullable: true }),
    smoothingHalfWidth: new FormControl('', { nonNullable: true }),
  });

  /** The engine's table reader for the preview, loaded apart from the first screen (`cp-table-preview.ts`). */
  private readonly reader = signal<typeof import('./cp-table-preview') | null>(null);

  private readonly binding = bindCellForm<PressureFormValue>({
    form: this.form,
    cell: this.cell,
    // The table is read as it is typed: it stays read-only until the reader is here.
    ready: computed(() => this.reader() !== null),
    toForm: (inputs) => ({
      text: typeof inputs['text'] === 'string' ? inputs['text'] : '',
      layout: inputs['layout'] === 'surface' ? 'surface' : 'closedLoop',
      surfaceName: typeof inputs['surfaceName'] === 'string' ? inputs['surfaceName'] : 'upper',
      hasRadius: inputs['hasRadius'] === true,
      smoothing: inputs['smoothing'] === 'off' || inputs['smoothing'] === 'width' ? inputs['smoothing'] : 'auto',
      smoothingHalfWidth: numberText(inputs['smoothingHalfWidth']),
    }),
    fromForm: (value, previous) => {
      const edited = value.text !== previous['text'];
      return {
        ...previous,
        text: value.text,
        layout: value.layout,
        surfaceName: value.surfaceName,
        hasRadius: value.hasRadius,
        smoothing: value.smoothing,
        smoothingHalfWidth: value.smoothing === 'width' ? numberInput(value.smoothingHalfWidth) : undefined,
        // A table edited after upload is no longer the stored file; the name stays to say where it came from.
        uploadId: edited ? null : (previous['uploadId'] ?? null),
        filename: previous['filename'] ?? null,
      };
    },
  });

  private readonly textArea = viewChild<ElementRef<HTMLTextAreaElement>>('table');
  protected readonly uploading = signal(false);
  protected readonly uploadProblem = signal<string | null>(null);
  protected readonly uploadLimitMb = UPLOAD_LIMIT_BYTES / (1024 * 1024);
  /** The table an upload replaced, until put back or edited further: nothing pasted is lost to an upload. */
  protected readonly replaced = signal<{ readonly inputs: Readonly<Record<string, unknown>>; readonly filename: string } | null>(null);

  protected readonly inputs = computed(() => this.cell().inputs);
  protected readonly layout = computed<Layout>(() => (this.inputs()['layout'] === 'surface' ? 'surface' : 'closedLoop'));
  protected readonly filename = computed(() => (typeof this.inputs()['filename'] === 'string' ? (this.inputs()['filename'] as string) : null));
  protected readonly fromStoredFile = computed(() => typeof this.inputs()['uploadId'] === 'string');

  protected readonly preview = computed(() => {
    const reader = this.reader();
    if (!reader) return EMPTY_PREVIEW;
    const inputs = this.inputs();
    const text = typeof inputs['text'] === 'string' ? inputs['text'] : '';
    return reader.previewCpTable(text, this.layout(), String(inputs['surfaceName'] ?? 'upper'), inputs['hasRadius'] === true);
  });

  constructor() {
    inject(PendingTasks).run(() => import('./cp-table-preview').then((reader) => this.reader.set(reader)));
  }

  /** Every problem with a line: the reader's as typed, then the server's from the last save or run. */
  protected readonly lineProblems = computed((): LineProblem[] => {
    const seen = new Set<string>();
    const list: LineProblem[] = [];
    const add = (line: number, message: string) => {
      const key = `${line}:${message}`;
      if (!seen.has(key)) {
        seen.add(key);
        list.push({ line, message });
      }
    };
    for (const p of this.preview().problems) add(p.line, p.message);
    const preview = this.preview();
    if (preview.problems.length === 0) {
      for (const p of this.cell().problems) if (p.field === 'text' || p.line !== undefined) add(p.line ?? 0, p.message);
      const error = this.cell().output?.status === 'error' ? this.cell().output?.error : null;
      for (const p of error?.problems ?? []) add(p.line, p.message);
    }
    // By line, the table's own problems first; the count of problems not listed stays last.
    const unlisted = (p: LineProblem) => p.line === 0 && /^and \d+ more/.test(p.message);
    return list.sort((a, b) => Number(unlisted(a)) - Number(unlisted(b)) || a.line - b.line);
  });

  /** Warnings on the table as read here, until the run's own (which include them) are shown. */
  protected readonly previewWarnings = computed(() => (this.result() && this.cell().runState === 'current' ? [] : this.preview().warnings));

  protected readonly result = computed(() => {
    const shown = shownResult(this.cell());
    return shown ? (shown.output.result as PressureResult) : null;
  });

  /** The computed result's plot while it is current; otherwise the table as read here. */
  protected readonly figure = computed(() => {
    const result = this.result();
    if (result && this.cell().runState === 'current') return resultFigure(result);
    return this.preview().figure;
  });

  /** dUe/ds smoothed and unsmoothed, while the result is current. */
  protected readonly slopeFigure = computed(() => {
    const result = this.result();
    return result && this.cell().runState === 'current' ? slopeFigure(result) : null;
  });

  /** The smoothing the run took, per surface, in words. */
  protected readonly smoothingSummary = computed(() => {
    const result = this.result();
    if (!result || this.cell().runState !== 'current') return [];
    return result.surfaces.flatMap((surface) =>
      surface.smoothing ? [{ name: surface.name, halfWidth: surface.smoothing.halfWidth, scatter: surface.smoothing.scatter }] : [],
    );
  });

  protected readonly stagnation = computed(() => {
    const result = this.result();
    const found = result && this.cell().runState === 'current' ? resultStagnation(result) : null;
    if (found) return { ...found, computed: true };
    const local = this.preview().stagnation;
    return local ? { ...local, computed: false } : null;
  });

  protected problem(control: string): string {
    return this.binding.problems().get(control) ?? '';
  }

  /** Puts the caret on a problem's line, so the person can fix it where it is. */
  protected goToLine(line: number): void {
    const area = this.textArea()?.nativeElement;
    if (!area || line < 1) return;
    const lines = area.value.split(/\r\n|\r|\n/);
    let start = 0;
    for (let i = 0; i < line - 1 && i < lines.length; i++) start += lines[i].length + 1;
    const end = start + (lines[line - 1]?.length ?? 0);
    area.focus();
    area.setSelectionRange(start, end);
    const lineHeight = parseFloat(getComputedStyle(area).lineHeight) || 18;
    area.scrollTop = Math.max(0, (line - 3) * lineHeight);
  }

  /** Puts back the table an upload replaced. */
  protected putBack(): void {
    const replaced = this.replaced();
    if (!replaced) return;
    this.session.setInputs(this.cell().cellId, { ...replaced.inputs });
    this.replaced.set(null);
  }

  protected pickFile(input: HTMLInputElement): void {
    input.value = '';
    input.click();
  }

  protected async upload(event: Event): Promise<void> {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    if (file.size > UPLOAD_LIMIT_BYTES) {
      this.uploadProblem.set(`${file.name} is ${(file.size / (1024 * 1024)).toFixed(1)} MB; the limit is ${this.uploadLimitMb} MB.`);
      return;
    }
    const binary = binaryTableFault(await firstBytes(file));
    if (binary) {
      this.uploadProblem.set(`${file.name} is not a text table: it ${binary}. Save the sheet as CSV or text (x [y] Cp rows) and upload that; the table above is unchanged.`);
      return;
    }
    const studyId = this.session.draft()?.studyId;
    if (!studyId) return;
    this.uploading.set(true);
    this.uploadProblem.set(null);
    this.api.upload(studyId, file).subscribe({
      next: (upload) => {
        this.uploading.set(false);
        const current = this.cell();
        const before = typeof current.inputs['text'] === 'string' ? current.inputs['text'] : '';
        // Whatever was there before stays one click away.
        this.replaced.set(before.trim() !== '' && before !== upload.text ? { inputs: current.inputs, filename: upload.filename } : null);
        this.session.setInputs(current.cellId, { ...current.inputs, text: upload.text, uploadId: upload.uploadId, filename: upload.filename });
      },
      error: (error: unknown) => {
        this.uploading.set(false);
        this.uploadProblem.set(problemMessage(toProblem(error)));
      },
    });
  }
}

/** The first 64 KB of a file, where any binary format shows itself. */
async function firstBytes(file: Blob): Promise<Uint8Array> {
  const head = file.slice(0, 65_536);
  if (typeof head.arrayBuffer === 'function') return new Uint8Array(await head.arrayBuffer());
  return new Promise((resolve, reject) => {
    const reader = new FileReader();
    reader.onload = () => resolve(new Uint8Array(reader.result as ArrayBuffer));
    reader.onerror = () => reject(reader.error);
    reader.readAsArrayBuffer(head);
  });
}
