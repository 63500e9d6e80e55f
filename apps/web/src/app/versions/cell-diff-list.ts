import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { CellChange, CellDiff, PressureTableDiff } from '@laminote/contracts';
import { cellKindInfo } from '../shared/cell-kinds';

const CHANGE_LABELS: Record<CellChange, string> = {
  added: 'Added',
  removed: 'Removed',
  changed: 'Changed',
  moved: 'Moved',
  unchanged: 'Unchanged',
};

const CHANGE_ICONS: Record<CellChange, string> = {
  added: 'add_circle',
  removed: 'remove_circle',
  changed: 'edit',
  moved: 'swap_vert',
  unchanged: 'check',
};

/** ΔCp with its sign, in the table's own precision. */
export function signed(value: number | null, digits = 4): string {
  if (value === null || !Number.isFinite(value)) return '—';
  const text = Math.abs(value).toFixed(digits);
  return value > 0 ? `+${text}` : value < 0 ? `−${text}` : text;
}

interface TableLine {
  readonly surface: string;
  readonly summary: string;
}

function tableLines(table: PressureTableDiff): TableLine[] {
  return table.surfaces.map((s) => {
    const parts: string[] = [];
    if (s.maxAbsDeltaCp !== null) {
      parts.push(
        s.maxAbsDeltaCp === 0
          ? `${s.matched.length} rows, Cp unchanged`
          : `max |ΔCp| ${s.maxAbsDeltaCp.toFixed(4)} at x/c ${s.maxAt?.toFixed(4)} (rms ${s.rmsDeltaCp?.toFixed(4)}, ${s.matched.filter((m) => m.deltaCp !== 0).length} of ${s.matched.length} rows differ)`,
      );
    } else {
      parts.push('no row at the same x in both tables');
    }
    if (s.rowsAdded.length) parts.push(`${s.rowsAdded.length} row${s.rowsAdded.length === 1 ? '' : 's'} added`);
    if (s.rowsRemoved.length) parts.push(`${s.rowsRemoved.length} row${s.rowsRemoved.length === 1 ? '' : 's'} removed`);
    return { surface: s.name, summary: parts.join('; ') };
  });
}

/**
 * What changed between two versions, cell by cell: added, removed, moved and changed cells, each
 * changed input as old → new, a pressure table as numbers (ΔCp), a note as lines added and removed.
 */
@Component({
  selector: 'lam-cell-diff-list',
  imports: [MatIconModule],
  templateUrl: './cell-diff-list.html',
  styleUrl: './cell-diff-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CellDiffList {
  readonly diffs = input.required<readonly CellDiff[]>();
  /** Unchanged cells are listed only when asked for. */
  readonly showUnchanged = input(false);

  protected readonly rows = computed(() =>
    this.diffs()
      // A cell whose own inputs are unchanged but whose stored result differs (a cell it uses changed) is a change.
      .filter((d) => this.showUnchanged() || d.change !== 'unchanged' || d.outputChanged)
      .map((d) => {
        const info = cellKindInfo(d.kind);
        return {
          diff: d,
          icon: info.icon,
          kindLabel: info.label,
          title: (d.titleB ?? d.titleA ?? '').trim() || info.label,
          changeLabel: d.change === 'unchanged' && d.outputChanged ? 'Result changed' : CHANGE_LABELS[d.change],
          /** Why the result moved though the inputs did not. */
          upstreamNote: (d.change === 'unchanged' || d.change === 'moved') && d.outputChanged ? 'same inputs; its result differs because a cell it uses changed' : null,
          changeIcon: CHANGE_ICONS[d.change],
          place:
            d.positionA !== null && d.positionB !== null && d.positionA !== d.positionB
              ? `cell ${d.positionA + 1} → ${d.positionB + 1}`
              : d.positionB !== null
                ? `cell ${d.positionB + 1}`
                : `was cell ${(d.positionA ?? 0) + 1}`,
          fields: d.fields.filter((f) => f.path !== 'text' || !d.table),
          tableText: d.fields.find((f) => f.path === 'text' && d.table),
          table: d.table ? tableLines(d.table) : [],
          tableProblems: d.table?.problems ?? [],
        };
      }),
  );
}
