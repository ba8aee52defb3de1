import type { VersionState } from '../../../shared/schemas/template-api';
/** A users row as stored (SQLite gives active as 1/0, PostgreSQL as a boolean). */
export interface StoredUserRow {
  id: number;
  email: string;
  name: string;
  role: string;
  password_hash: string | null;
  active: number | boolean;
  display_unit: string | null;
  created_at: string | Date;
}

/** A components row with the number of template versions that use it. */
export interface StoredComponentRow {
  id: number; code: string; kind: string; name: string; unit: string;
  dowels: string; stops: string; jaw_faces: string; clamp: string | null; outline: string | null; outline_file: string | null;
  layer: string; notes: string; seat_height: number | string; jaw_top: number | string | null;
  created_at: string | Date; updated_at: string | Date; used_by?: number | string | null;
}

/**
 * A stored, unexpired session (its data as stored: JSON text or already parsed), the user it is
 * signed in as, if any, and the catalog's read stamp as it stood at that read (read-stamps.ts).
 */
export interface SessionAndUser { sess: string | object; user: StoredUserRow | undefined; catalogStamp: number }

/** One catalog page: `pattern` is a contains-pattern with its escape character (dialect.containsPattern), or null for all. */
export interface ComponentPageQuery { kind: string | null; pattern: string | null; limit: number | null; offset: number }

export interface HotReads {
  /** The session `sid` if it has not expired by `now`, joined with its signed-in user in the same read. */
  sessionAndUser(sid: string, now: Date): Promise<SessionAndUser | undefined>;
  userById(id: number): Promise<StoredUserRow | undefined>;
  /** One page of components ordered by code (code-point order) and the count of all that match. */
  componentPage(q: ComponentPageQuery): Promise<{ rows: StoredComponentRow[]; total: number }>;
  /** A read stamp's counter (read-stamps.ts); 0 before the first write. */
  stamp(name: string): Promise<number>;
  /** The content hash and state of a template version, or undefined when there is no such version. */
  versionHash(templateId: number, number: number): Promise<{ hash: string; state: VersionState } | undefined>;
}
