/**
 * Lab briefs are Markdown written by instructors: rendered with marked and sanitised with
 * DOMPurify before they reach the page, so a brief can never run script or load a frame. Only
 * the browser sanitises (DOMPurify needs a DOM); the server stores the Markdown source.
 */
import DOMPurify from 'dompurify';
import { marked } from 'marked';
import { SAFETY_CAUTION } from '@shared/labs/safetyCaution';

/** Markdown → safe HTML. Links open in a new tab without giving it this page (`noopener`). */
export function renderMarkdown(source: string): string {
  const html = marked.parse(source, { async: false, gfm: true });
  const clean = DOMPurify.sanitize(html, { USE_PROFILES: { html: true }, FORBID_TAGS: ['style', 'form', 'input', 'iframe'], FORBID_ATTR: ['style'] });
  return clean.replace(/<a href=/g, '<a target="_blank" rel="noopener noreferrer" href=');
}

/** Whether a brief already carries the safety caution (the standard labs end with it). */
export function briefHasCaution(source: string): boolean {
  return source.includes(SAFETY_CAUTION) || /lockout|lock out \/ tag out/i.test(source);
}
