// Numbers as the Models stage shows them; shared with the written reading of the comparison.
export { fmt, fmtP } from '@shared/model/number-text';
