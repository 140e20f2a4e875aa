/** Shapes the take review page reads from the API; safe to import from client components. */

export interface TakePeaks {
  duration: number;
  framesPerBucket: number;
  channels: number;
  sampleRate: number;
  /** Per channel, alternating bucket minimum and maximum, −1…1 of full scale. */
  peaks: number[][];
}

export interface TakeCommentView {
  id: number;
  takeId: number;
  atSec: number;
  body: string;
  author: { id: number; name: string } | null;
  createdAt: string;
}
