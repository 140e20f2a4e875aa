import 'server-only';
import { DEFAULT_SPEC } from '@/dsp/spec';
import { db } from './connection.server';
import { hashPassword } from '@/lib/auth/passwords.server';
import { DeliverySpec, Recorder, RecordingSession, Studio, User } from '@/models';
import type { Role } from '@/models/User';
import type { Thresholds } from '@/models/DeliverySpec';

// An invented scenario: a podcast and radio-drama studio and a second, unrelated studio.
export const DEMO_STUDIO_NAME = 'Lanternfish Audio Works';
const HOME_STUDIO = DEMO_STUDIO_NAME;
const OUTSIDE_STUDIO = 'Quarry Hill Post';

const PEOPLE: { email: string; name: string; role: Role; studio: string }[] = [
  { email: 'engineer@demo.test', name: 'Ines Varga', role: 'engineer', studio: HOME_STUDIO },
  { email: 'producer@demo.test', name: 'Tomasz Okafor', role: 'producer', studio: HOME_STUDIO },
  { email: 'manager@demo.test', name: 'Maren Lindqvist', role: 'manager', studio: HOME_STUDIO },
  { email: 'outside-manager@demo.test', name: 'Priya Raman', role: 'manager', studio: OUTSIDE_STUDIO },
];

const { name: _defaultName, ...defaults } = DEFAULT_SPEC;
const SPECS: { name: string; description: string; thresholds: Thresholds }[] = [
  {
    name: 'Podcast master (−16 LUFS)',
    description: 'Common podcast delivery practice: −16 LUFS integrated, true peak at most −1 dBTP. Check each platform’s own current rules.',
    thresholds: { ...defaults, loudnessTargetLufs: -16, loudnessToleranceLu: 1, loudnessIsStrict: false, requiredSampleRate: 48000 },
  },
  {
    name: 'Broadcast drama (EBU R 128)',
    description: 'EBU R 128: −23 LUFS integrated, maximum true peak −1 dBTP; 48 kHz, 24-bit capture. The broadcaster’s own delivery spec comes first.',
    thresholds: { ...defaults, loudnessTargetLufs: -23, loudnessToleranceLu: 1, requiredSampleRate: 48000, requiredBitDepth: 24, minEffectiveBits: 20 },
  },
];

const RECORDERS = [
  { label: 'Booth A interface', makeModel: 'Halden A2 USB interface', serial: 'HA2-10431', location: 'Booth A', bextMatch: 'HALDEN-A2' },
  { label: 'Field kit 2', makeModel: 'Corvid FR-8 field recorder', serial: 'FR8-2207', location: 'Equipment room', bextMatch: 'CORVID FR-8' },
  { label: 'Stage box West', makeModel: 'Tidewater 16x stage box', serial: 'TW16-0098', location: 'Live room', bextMatch: 'TW16' },
];

async function studio(name: string) {
  const [row] = await Studio.findOrCreate({ where: { name }, defaults: { name } });
  return row;
}

/** Creates the demo studios, people, fleet, specs and sessions; keeps whatever already exists. */
export async function seedDemo(password: string): Promise<{ created: string[] }> {
  db();
  const created: string[] = [];
  const home = await studio(HOME_STUDIO);
  const outside = await studio(OUTSIDE_STUDIO);
  const studioIds: Record<string, number> = { [HOME_STUDIO]: home.id, [OUTSIDE_STUDIO]: outside.id };
  const hash = await hashPassword(password);
  const users: Record<string, User> = {};
  for (const p of PEOPLE) {
    const [user, isNew] = await User.findOrCreate({
      where: { email: p.email },
      defaults: { email: p.email, name: p.name, role: p.role, studioId: studioIds[p.studio], passwordHash: hash },
    });
    users[p.role + (p.studio === HOME_STUDIO ? '' : ':outside')] = user;
    if (isNew) created.push(p.email);
  }
  for (const r of RECORDERS) {
    await Recorder.findOrCreate({ where: { studioId: home.id, label: r.label }, defaults: { ...r, studioId: home.id, notes: null } });
  }
  await Recorder.findOrCreate({
    where: { studioId: outside.id, label: 'Mix room converter' },
    defaults: { studioId: outside.id, label: 'Mix room converter', makeModel: 'Osprey 8i converter', serial: 'OS8-5511', location: 'Mix room', bextMatch: null, notes: null },
  });
  const specs: DeliverySpec[] = [];
  for (const s of SPECS) {
    const [spec] = await DeliverySpec.findOrCreate({ where: { studioId: home.id, name: s.name }, defaults: { ...s, studioId: home.id } });
    specs.push(spec);
  }
  const sessions = [
    { title: 'Harbour Lights — episode 12', client: 'Harbour Lights podcast', recordedOn: '2026-11-27', room: 'Booth A', notes: 'Two-person interview, one guest on a field recorder.', deliverySpecId: specs[0].id },
    { title: 'The Night Ferry — drama day 3', client: 'Night Ferry radio drama', recordedOn: '2026-11-30', room: 'Live room', notes: 'Scenes 14–19. Watch the door slams in scene 17.', deliverySpecId: specs[1].id },
  ];
  for (const s of sessions) {
    const [, isNew] = await RecordingSession.findOrCreate({
      where: { studioId: home.id, title: s.title },
      defaults: { ...s, studioId: home.id, engineerId: users.engineer.id, producerId: users.producer.id },
    });
    if (isNew) created.push(`session "${s.title}"`);
  }
  await RecordingSession.findOrCreate({
    where: { studioId: outside.id, title: 'Quarry Hill audiobook, chapter 4' },
    defaults: { studioId: outside.id, title: 'Quarry Hill audiobook, chapter 4', client: 'Quarry Hill Press', recordedOn: '2026-11-29', room: 'Booth 1', notes: null, engineerId: null, producerId: null, deliverySpecId: null },
  });
  return { created };
}
