// What other features may use of recordings: the desk's panel and the sitting page's section.
export { SlotRecordingsPanel } from './components/SlotRecordingsPanel';
export { SittingRecordings } from './components/SittingRecordings';
export { RecordingPlayer } from './components/RecordingPlayer';
