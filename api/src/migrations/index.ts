import { Foundation1764633600000 } from './1764633600000-Foundation.js';
import { RubricsListsFingerings1796163564233 } from './1796163564233-RubricsListsFingerings.js';
import { MailAndAccountLinks1796163605141 } from './1796163605141-MailAndAccountLinks.js';
import { Sittings1796164957096 } from './1796164957096-Sittings.js';
import { MarkingDesk1796165637720 } from './1796165637720-MarkingDesk.js';
import { Results1796173495994 } from './1796173495994-Results.js';
import { Standardisation1796173567184 } from './1796173567184-Standardisation.js';
import { ReferenceRecording1796175275320 } from './1796175275320-ReferenceRecording.js';
import { Recordings1796174237839 } from './1796174237839-Recordings.js';
import { Moderation1796174762014 } from './1796174762014-Moderation.js';
import { ProgressIndexes1796176027165 } from './1796176027165-ProgressIndexes.js';
import { PeerPercentileIndex1796189376292 } from './1796189376292-PeerPercentileIndex.js';
import { SittingMailInOutbox1796192508703 } from './1796192508703-SittingMailInOutbox.js';
import { LatestResults1796193339206 } from './1796193339206-LatestResults.js';

/** Listed by class, not by glob, so tests and dist/ share one list (toolchain.md). Append only. */
export const migrations = [Foundation1764633600000, RubricsListsFingerings1796163564233, MailAndAccountLinks1796163605141, Sittings1796164957096, MarkingDesk1796165637720, Results1796173495994, Standardisation1796173567184, Recordings1796174237839, Moderation1796174762014, ReferenceRecording1796175275320, ProgressIndexes1796176027165, PeerPercentileIndex1796189376292, SittingMailInOutbox1796192508703, LatestResults1796193339206];
