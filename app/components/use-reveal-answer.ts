import { useEffect, useRef } from "react";

/**
 * After a form's submit, brings what it produced into view: on a phone the answer is below the
 * form, and nothing visible would change. A new answer: its heading is scrolled to the top of the
 * screen and takes the focus. No answer (the submit brought messages beside the fields): the first
 * field marked invalid is scrolled to the middle of the screen and takes the focus. Used by the
 * fit check and the calculators.
 *
 * `headingId`: the answer's heading (give it tabIndex={-1}). `loaded`: what the loader returned
 * (a new value after each navigation). `answered`: whether there is an answer to show.
 *
 * Returns the handler for the form's onSubmit.
 */
export function useRevealAnswer(headingId: string, loaded: unknown, answered: boolean): () => void {
  const submitted = useRef(false);
  useEffect(() => {
    if (!submitted.current) return;
    submitted.current = false;
    if (answered) {
      const heading = document.getElementById(headingId);
      heading?.scrollIntoView({ block: "start" });
      heading?.focus({ preventScroll: true });
      return;
    }
    const field = document.querySelector<HTMLElement>("main [aria-invalid='true']");
    field?.scrollIntoView({ block: "center" });
    field?.focus({ preventScroll: true });
    // Only a navigation moves the page; `answered` and the id are read as they are then.
  }, [loaded]);
  return () => {
    submitted.current = true;
  };
}
