/** An instant as reports print it: minutes, UTC. (No imports: the PDF worker thread loads this.) */
export function when(iso: string): string {
  return `${iso.slice(0, 16).replace('T', ' ')} UTC`;
}
