import type { FieldPath, UseFormSetError } from 'react-hook-form';
import { ApiError } from '../../../lib/api';
import type { CoreFormValues } from './core-form-schema';

// Where each part of the API body sits in the form (the form flattens the model and link keys).
function fieldOf(path: string): FieldPath<CoreFormValues> | null {
  const parts = path.replace(/^body\./, '').split('.');
  if (parts[0] === 'name' || parts[0] === 'slug') return parts[0];
  if (parts[0] === 'linkProfile' && (parts[1] === 'baud' || parts[1] === 'crc')) return parts[1];
  if (parts[0] === 'modelConfig' && parts[1]) return parts[1] as FieldPath<CoreFormValues>;
  if (parts[0] === 'limits' && parts[1]) return `limits.${parts[1]}` as FieldPath<CoreFormValues>;
  return null;
}

/**
 * Put a refused save's message next to the field it names ("body.limits.x: …"); anything the form
 * cannot place is returned for the form's own error line.
 */
export function placeServerError(err: unknown, setError: UseFormSetError<CoreFormValues>): string | null {
  if (!(err instanceof ApiError)) return `The core could not be saved: ${(err as Error).message}`;
  if (err.status === 403) return 'Only engineers can change cores.';
  const m = /^([\w.]+): (.+)$/.exec(err.message);
  const field = m ? fieldOf(m[1]) : null;
  if (m && field) {
    setError(field, { message: m[2].charAt(0).toUpperCase() + m[2].slice(1) });
    return null;
  }
  return `The server refused the core: ${err.message}`;
}
