/**
 * Who the actors of recorded events are, for the audit log. Declared here, with no table, because the
 * users module (which keeps the names) records audit events itself: the audit module asks this instead
 * of importing users. users/actor-names.reader.ts implements it; UsersModule provides it to the app.
 */
export abstract class ActorDirectory {
  /** The names of these users, by id (ids that name no user are left out). */
  abstract namesOf(ids: readonly number[]): Promise<Map<number, string>>;

  /** The ids of the users whose name matches a LIKE pattern (already escaped). */
  abstract idsNamedLike(pattern: string): Promise<number[]>;
}
