import { AuditEvent } from '../audit/entities/audit-event.entity.js';
import { RefreshToken } from '../auth/entities/refresh-token.entity.js';
import { ClassGroup } from '../classes/entities/class-group.entity.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { Term } from '../organisations/entities/term.entity.js';
import { Guardian } from '../students/entities/guardian.entity.js';
import { Student } from '../students/entities/student.entity.js';
import { Membership } from '../users/entities/membership.entity.js';
import { Person } from '../users/entities/person.entity.js';
import { RubricCriterionRow } from '../rubrics/entities/rubric-criterion.entity.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { Rubric } from '../rubrics/entities/rubric.entity.js';
import { RequirementLineRow } from '../requirement-lists/entities/requirement-line.entity.js';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { RequirementList } from '../requirement-lists/entities/requirement-list.entity.js';
import { StudentFingering } from '../fingerings/entities/student-fingering.entity.js';
import { OutboundMail } from '../mail/entities/outbound-mail.entity.js';
import { AccountToken } from '../invitations/entities/account-token.entity.js';
import { BandPolicyVersion } from '../sittings/entities/band-policy.entity.js';
import { AccessArrangement } from '../sittings/entities/access-arrangement.entity.js';
import { Sitting } from '../sittings/entities/sitting.entity.js';
import { SittingPaper } from '../sittings/entities/sitting-paper.entity.js';
import { SittingExaminer } from '../sittings/entities/sitting-examiner.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';
import { SlotDraw } from '../marking/entities/slot-draw.entity.js';
import { MarkSheet } from '../marking/entities/mark-sheet.entity.js';
import { MarkCell } from '../marking/entities/mark-cell.entity.js';
import { MarkChange } from '../marking/entities/mark-change.entity.js';
import { Result } from '../results/entities/result.entity.js';
import { LatestResult } from '../results/entities/latest-result.entity.js';
import { ModerationCase } from '../moderation/entities/moderation-case.entity.js';
import { StandardisationExercise } from '../standardisation/entities/standardisation-exercise.entity.js';
import { StandardisationAttempt } from '../standardisation/entities/standardisation-attempt.entity.js';
import { Recording } from '../recordings/entities/recording.entity.js';

/** Every entity, listed once for the data source, the tests and the CLI. */
export const entities = [
  Organisation,
  Term,
  Person,
  Membership,
  RefreshToken,
  ClassGroup,
  Student,
  Guardian,
  AuditEvent,
  Rubric,
  RubricVersion,
  RubricCriterionRow,
  RequirementList,
  RequirementListVersion,
  RequirementLineRow,
  StudentFingering,
  OutboundMail,
  AccountToken,
  BandPolicyVersion,
  AccessArrangement,
  Sitting,
  SittingPaper,
  SittingExaminer,
  Slot,
  SlotDraw,
  MarkSheet,
  MarkCell,
  MarkChange,
  Result,
  LatestResult,
  ModerationCase,
  StandardisationExercise,
  StandardisationAttempt,
  Recording,
];
