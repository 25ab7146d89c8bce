/** A display the kernel cannot turn into an output; the message says why and what to pass instead. */
export class DisplayError extends Error {
  override readonly name = "DisplayError";
}
