/** The single error shape every API error has (design.md §6). */
export interface ApiErrorBody {
  statusCode: number;
  error: string;
  message: string;
  details?: { path: string; message: string }[] | Record<string, unknown>;
}
