/** Every record that belongs to one organisation has this column; the scoped data layer relies on it. */
export interface OrgOwned {
  id: string;
  organisationId: string;
}
