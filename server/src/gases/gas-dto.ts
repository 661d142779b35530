import type { GasDto, GasSpec, GasVersionDto, PersonRef } from '@traceloom/shared/api';
import type { Gas, GasVersion, User } from '../db/entities/index.js';

/** `{id, displayName}` of a loaded user. */
export function personRef(user: Pick<User, 'id' | 'displayName'>): PersonRef {
  return { id: user.id, displayName: user.displayName };
}

/** The stored spec text of a version, as JSON. */
export function specOf(version: GasVersion): GasSpec {
  return JSON.parse(version.spec) as GasSpec;
}

/** A gas loaded with `study`, `versions.createdBy`. */
export function toGasDto(gas: Gas): GasDto {
  const versions = [...gas.versions].sort((a, b) => a.version - b.version);
  const current = versions.find((v) => v.version === gas.currentVersion)!;
  return {
    id: gas.id,
    studyId: gas.study.id,
    title: gas.title,
    version: gas.currentVersion,
    spec: specOf(current),
    versions: versions.map((v) => ({
      version: v.version,
      createdAt: v.createdAt,
      createdBy: personRef(v.createdBy),
    })),
    createdAt: gas.createdAt,
    updatedAt: gas.updatedAt,
  };
}

/** A version loaded with `createdBy`. */
export function toGasVersionDto(version: GasVersion): GasVersionDto {
  return {
    version: version.version,
    spec: specOf(version),
    createdAt: version.createdAt,
    createdBy: personRef(version.createdBy),
  };
}
