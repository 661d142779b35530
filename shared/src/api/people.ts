/** A person as gas, run, reference and comparison answers name them beside a change. */
export interface PersonRef {
  id: string;
  displayName: string;
}
