import { Pipe, type PipeTransform } from '@angular/core';
import type { CellKind } from '@laminote/contracts/cell-kinds';
import { readableMessage } from '@laminote/contracts/field-words';

/** A message from the engine or the API with its field names said as the screen labels them. */
@Pipe({ name: 'readable' })
export class ReadablePipe implements PipeTransform {
  transform(message: string, kind: CellKind | null = null): string {
    return readableMessage(message, kind);
  }
}
