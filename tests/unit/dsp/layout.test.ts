import { describe, expect, it } from 'vitest';
import { channelLayout, ixmlTrackNames } from '../../../dsp/layout';

// iXML TRACK_LIST (iXML specification, gallery.co.uk/ixml); speaker bits of WAVE_FORMAT_EXTENSIBLE
// (Microsoft ksmedia.h: FL 0x1, FR 0x2, FC 0x4, LFE 0x8, BL 0x10, BR 0x20, SL 0x200, SR 0x400) [from memory].
const ixml = (tracks: string) => `<?xml version="1.0"?><BWFXML><TRACK_LIST><TRACK_COUNT>3</TRACK_COUNT>${tracks}</TRACK_LIST></BWFXML>`;

describe('iXML track names', () => {
  it('places names by INTERLEAVE_INDEX (the position in the file), decodes entities, and leaves unnamed tracks null', () => {
    const text = ixml(
      '<TRACK><CHANNEL_INDEX>5</CHANNEL_INDEX><INTERLEAVE_INDEX>2</INTERLEAVE_INDEX><NAME>Lav &amp; Co</NAME></TRACK>' +
        '<TRACK><CHANNEL_INDEX>1</CHANNEL_INDEX><INTERLEAVE_INDEX>1</INTERLEAVE_INDEX><NAME>Boom</NAME></TRACK>',
    );
    expect(ixmlTrackNames(text, 3)).toEqual(['Boom', 'Lav & Co', null]);
  });

  it('falls back to CHANNEL_INDEX, then to list order; ignores indexes outside the file', () => {
    expect(ixmlTrackNames(ixml('<TRACK><CHANNEL_INDEX>2</CHANNEL_INDEX><NAME>B</NAME></TRACK>'), 2)).toEqual([null, 'B']);
    expect(ixmlTrackNames(ixml('<TRACK><NAME>A</NAME></TRACK><TRACK><NAME>B</NAME></TRACK><TRACK><INTERLEAVE_INDEX>9</INTERLEAVE_INDEX><NAME>C</NAME></TRACK>'), 2)).toEqual(['A', 'B']);
  });

  it('is null without iXML or without a track list', () => {
    expect(ixmlTrackNames(null, 2)).toBeNull();
    expect(ixmlTrackNames('<BWFXML><PROJECT>x</PROJECT></BWFXML>', 2)).toBeNull();
  });
});

describe('channel layout', () => {
  it('mono, and stereo with or without a mask', () => {
    expect(channelLayout(1, null, null)).toEqual({ layout: 'mono', names: [null] });
    expect(channelLayout(2, null, null)).toEqual({ layout: 'stereo', names: ['L', 'R'] });
    expect(channelLayout(2, 0x3, null)).toEqual({ layout: 'stereo', names: ['L', 'R'] });
  });

  it('surround from a mask (5.1 with back or side surrounds) or from a conventional channel count', () => {
    expect(channelLayout(6, 0x3f, null)).toEqual({ layout: 'surround', names: ['L', 'R', 'C', 'LFE', 'Ls', 'Rs'] });
    expect(channelLayout(6, 0x60f, null)).toEqual({ layout: 'surround', names: ['L', 'R', 'C', 'LFE', 'Ls', 'Rs'] });
    expect(channelLayout(8, 0x63f, null).names).toEqual(['L', 'R', 'C', 'LFE', 'Lb', 'Rb', 'Ls', 'Rs']);
    expect(channelLayout(6, null, null).layout).toBe('surround');
  });

  it('poly from an iXML track list, or from more than two channels with no loudspeaker layout', () => {
    const names = ixml([1, 2, 3, 4, 5, 6, 7, 8].map((n) => `<TRACK><INTERLEAVE_INDEX>${n}</INTERLEAVE_INDEX><NAME>T${n}</NAME></TRACK>`).join(''));
    expect(channelLayout(8, null, names)).toEqual({ layout: 'poly', names: ['T1', 'T2', 'T3', 'T4', 'T5', 'T6', 'T7', 'T8'] });
    expect(channelLayout(8, 0, names).layout).toBe('poly');
    expect(channelLayout(4, null, null)).toEqual({ layout: 'poly', names: [null, null, null, null] });
    // A mask that does not name every channel does not make a loudspeaker layout.
    expect(channelLayout(4, 0x3, null).layout).toBe('poly');
  });
});

describe('a recorder\'s stereo mix named in iXML', () => {
  const twoTracks = (left: string, right: string) =>
    ixml(`<TRACK><INTERLEAVE_INDEX>1</INTERLEAVE_INDEX><NAME>${left}</NAME></TRACK><TRACK><INTERLEAVE_INDEX>2</INTERLEAVE_INDEX><NAME>${right}</NAME></TRACK>`);

  // Field recorders write a TRACK_LIST for their stereo mode too; its left and right feeds are one
  // programme (polarity, programme loudness and a dead side judged as for any stereo take) [common practice].
  it.each([['L', 'R'], ['Left', 'Right'], ['MixL', 'MixR'], ['Mix L', 'Mix R'], ['ST_Left', 'ST_Right'], ['Lt', 'Rt'], ['L Mix', 'R Mix']])('%s / %s is stereo, names kept', (left, right) => {
    expect(channelLayout(2, null, twoTracks(left, right))).toEqual({ layout: 'stereo', names: [left, right] });
  });

  it('two iso tracks (boom and lavalier), a right-left swap, or one mix feed beside an iso track stay poly', () => {
    expect(channelLayout(2, null, twoTracks('Boom', 'Lav Anna')).layout).toBe('poly');
    expect(channelLayout(2, null, twoTracks('R', 'L')).layout).toBe('poly');
    expect(channelLayout(2, null, twoTracks('MixL', 'Boom')).layout).toBe('poly');
    expect(channelLayout(2, null, twoTracks('Lavalier', 'Radio')).layout).toBe('poly');
  });
});
