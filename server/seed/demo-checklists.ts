import type { ChecklistContentInput } from '@/features/registry/schema';
import type { RideClass } from '@/features/rides/schema';

/*
 * Demo checklist templates, one per ride class, written for this demo in our own words. They follow the
 * usual areas of a field inspection; they are examples to adapt, not a substitute for the maker's
 * inspection instructions or the jurisdiction's requirements.
 */

type Item = ChecklistContentInput['areas'][number]['items'][number];
type Area = { id: string; title: string; items: Item[] };

const look = (id: string, text: string, guidance?: string): Item => ({
  id,
  text,
  guidance,
  photoRequired: false,
  measurementRequired: false,
});
const photo = (id: string, text: string, guidance?: string): Item => ({
  ...look(id, text, guidance),
  photoRequired: true,
});
const measure = (
  id: string,
  text: string,
  kind: NonNullable<Item['measurementKind']>,
  label: string,
  withPhoto = false,
  limit: Item['limit'] = null,
): Item => ({
  ...look(id, text),
  photoRequired: withPhoto,
  measurementRequired: true,
  measurementKind: kind,
  measurementLabel: label,
  limit,
});
/** Checked against a pivot's design limit, so each ride is held to its own documents. */
const pivotLimit = (joint: number, quantity: 'pin_diameter' | 'clearance'): Item['limit'] => ({
  source: 'design',
  joint,
  quantity,
});

/** The areas of the structure and its joints: structure and welds, pins and bushings, bolted joints. */
function structuralAreas(): Area[] {
  return [
    {
      id: 'structure',
      title: 'Structure and welds',
      items: [
        look(
          'structure.level',
          'Base level and packing sound; no settlement, no packing crushed or missing',
          'Read the level at the marked points on the base frame.',
        ),
        measure(
          'structure.inclination',
          'Base inclination at the marked reference points',
          'angle',
          'largest reading',
        ),
        photo(
          'structure.weld-toes',
          'Weld toes at the main arm root and the pivot housings: no cracked paint, rust bleed or cracks',
        ),
        look('structure.corrosion', 'No corrosion that reduces a section; drain holes open'),
        look('structure.damage', 'No dents, kinks or impact marks on arms, tower and gondola frames'),
      ],
    },
    {
      id: 'pins',
      title: 'Pins and bushings',
      items: [
        look('pins.retainers', 'Every pin retainer, keeper plate and split pin present and secure'),
        look('pins.rotation', 'No sign of a pin turning in its lug (witness marks still aligned)'),
        measure(
          'pins.main-diameter',
          'Main pivot pin outside diameter',
          'lengthSmall',
          'two stations × two directions, smallest reading',
          true,
          pivotLimit(0, 'pin_diameter'),
        ),
        measure(
          'pins.main-clearance',
          'Main pivot diametral clearance, load reversed',
          'lengthSmall',
          'dial indicator, load reversed',
          false,
          pivotLimit(0, 'clearance'),
        ),
        look('pins.lubrication', 'Grease reaching every lubrication point; no dry running, no fretting dust'),
      ],
    },
    {
      id: 'bolts',
      title: 'Bolted joints',
      items: [
        look('bolts.witness', 'Witness marks on the marked joints unbroken'),
        measure(
          'bolts.torque',
          'Check torque on the sample bolts named in the maintenance manual',
          'moment',
          'lowest reading',
        ),
        look('bolts.locking', 'Locking devices (lock nuts, tab washers, wire) in place'),
      ],
    },
  ];
}

/** The areas of operation: rider restraints, drive and brakes, controls, signage and access, documents. */
function operationalAreas(): Area[] {
  return [
    {
      id: 'restraints',
      title: 'Rider restraints',
      items: [
        look(
          'restraints.every-seat',
          'Every restraint locks and unlocks as designed, seat by seat',
          'Push and pull each locked restraint; note the seat number of any that moves.',
        ),
        look('restraints.secondary', 'Secondary locking (belt, pin or second latch) works at every seat'),
        look('restraints.padding', 'Padding, belts and buckles undamaged'),
        look('restraints.indication', 'Lock indication at the operator console matches the restraints'),
      ],
    },
    {
      id: 'drive',
      title: 'Drive and brakes',
      items: [
        look('drive.gearbox', 'Gearbox and drive units: no leaks, no unusual noise, oil level correct'),
        look('drive.hydraulics', 'Hydraulic hoses and fittings: no leaks, chafing or bulges'),
        // The design data holds no brake values, so the range is written here. Invented for the demo:
        // use the brake maker's setting range.
        measure('drive.brake-gap', 'Brake air gap', 'lengthSmall', 'largest reading', false, {
          source: 'template',
          joint: null,
          min: 0.25e-3,
          max: 0.75e-3,
        }),
        look('drive.brake-lining', 'Brake linings above their wear mark'),
        measure(
          'drive.speed',
          'Running speed at the design programme',
          'rate',
          'over at least 5 revolutions or swings',
        ),
      ],
    },
    {
      id: 'electrical',
      title: 'Electrical and controls',
      items: [
        look('electrical.estop', 'Every emergency stop stops the ride; reset needs a deliberate action'),
        look('electrical.interlocks', 'Gate and restraint interlocks stop or prevent a start'),
        look('electrical.rcd', 'Residual-current device trips on its test button'),
        measure('electrical.insulation', 'Insulation resistance of the main circuits', 'count', 'MΩ'),
        look('electrical.cables', 'Cables, plugs and slip rings undamaged and protected'),
      ],
    },
    {
      id: 'signage',
      title: 'Signage and access',
      items: [
        look('signage.rider-rules', 'Rider rules and height limits posted and readable'),
        look('signage.fencing', 'Fencing, gates and queue lines complete; no gaps near moving parts'),
        look('signage.platform', 'Platform, steps and handrails secure and not slippery'),
      ],
    },
    {
      id: 'documents',
      title: 'Documents',
      items: [
        look('documents.logbook', 'Daily log signed for each day of operation since the last inspection'),
        look('documents.bulletins', 'Maker’s service bulletins received and acted on'),
        look('documents.modifications', 'No modification without a design review on file'),
        measure('documents.hours', 'Hour meter or cycle counter reading', 'count', 'h'),
      ],
    },
  ];
}

/** The areas every class shares; `extra` adds class-specific items to an area. */
function areas(extra: Partial<Record<string, Item[]>>): Area[] {
  const base: Area[] = [...structuralAreas(), ...operationalAreas()];
  return base.map((area) => ({ ...area, items: [...area.items, ...(extra[area.id] ?? [])] }));
}

export const demoChecklists: { name: string; rideClass: RideClass; areas: Area[] }[] = [
  {
    name: 'Pendulum swing — periodic inspection',
    rideClass: 'pendulum_swing',
    areas: areas({
      structure: [
        photo('structure.counterweight', 'Counterweight fixings and its box: no cracks, no loose plates'),
      ],
      pins: [
        measure(
          'pins.gondola-clearance',
          'Gondola bearing play at the arm tip',
          'lengthSmall',
          'dial indicator, load reversed',
          false,
          pivotLimit(1, 'clearance'),
        ),
      ],
      drive: [
        measure(
          'drive.amplitude',
          'Swing amplitude at the design programme',
          'angle',
          'largest swing each side',
        ),
      ],
    }),
  },
  {
    name: 'Rotating arm — periodic inspection',
    rideClass: 'rotating_arm',
    areas: areas({
      pins: [
        measure(
          'pins.sub-arm-clearance',
          'Sub-arm or gondola pivot play',
          'lengthSmall',
          'dial indicator, load reversed',
          true,
          pivotLimit(1, 'clearance'),
        ),
      ],
      restraints: [
        look('restraints.inverted', 'Restraints hold with the gondola inverted (test with the test dummy)'),
      ],
      drive: [look('drive.balance', 'Arm stops level when released at rest (no new out-of-balance)')],
    }),
  },
  {
    name: 'Wheel — periodic inspection',
    rideClass: 'wheel',
    areas: areas({
      structure: [look('structure.spokes', 'Spoke cables or tubes: tension marks aligned, no broken wires')],
      pins: [
        measure(
          'pins.hanger',
          'Gondola hanger pin diameter, sample of three gondolas',
          'lengthSmall',
          'smallest reading',
          true,
          pivotLimit(1, 'pin_diameter'),
        ),
      ],
      restraints: [
        look('restraints.doors', 'Gondola doors latch and cannot be opened from inside while running'),
      ],
      drive: [look('drive.tyres', 'Drive tyres inflated and in even contact with the rim')],
    }),
  },
  {
    name: 'Swing carousel — periodic inspection',
    rideClass: 'swing_carousel',
    areas: areas({
      pins: [
        measure(
          'pins.hanger-pin',
          'Crown hanger pin diameter, sample of four hangers',
          'lengthSmall',
          'smallest reading',
          true,
          pivotLimit(0, 'pin_diameter'),
        ),
        measure(
          'pins.chain',
          'Hanger chain elongation over the marked length',
          'lengthSmall',
          'longest reading',
        ),
      ],
      structure: [look('structure.crown-tilt', 'Crown tilt mechanism: no play beyond the marked limit')],
      drive: [look('drive.crown-stop', 'Crown comes to rest level before the seats can be unloaded')],
    }),
  },
  {
    name: 'Other rotating ride — periodic inspection',
    rideClass: 'other',
    areas: areas({}),
  },
];

/** What every class's pre-opening check asks; `extra` adds the class's own items. Invented wording. */
function dailyAreas(extra: Item[]): Area[] {
  return [
    {
      id: 'daily.site',
      title: 'Around the ride',
      items: [
        look('daily.site.fence', 'Queue line, fence and exit gates in place and closed'),
        look('daily.site.area', 'Nothing left in the swept area: tools, litter, loose items'),
        measure(
          'daily.site.wind',
          'Wind speed at the ride (the maker’s limit is on the ride board)',
          'count',
          'm/s',
        ),
      ],
    },
    {
      id: 'daily.ride',
      title: 'The ride',
      items: [
        look('daily.ride.restraints', 'Every restraint closes, locks and opens'),
        look('daily.ride.estop', 'Emergency stop tested from each station'),
        look('daily.ride.visual', 'Walk round: no loose, bent or cracked part seen'),
        ...extra,
      ],
    },
  ];
}

/** The daily pre-opening checklist of each class, which operators' staff fill in on their phones. */
export const demoDailyChecklists: { name: string; rideClass: RideClass; areas: Area[] }[] = [
  {
    name: 'Pendulum swing — pre-opening daily check',
    rideClass: 'pendulum_swing',
    areas: dailyAreas([look('daily.ride.brake', 'Swing brake holds the gondola at the platform')]),
  },
  {
    name: 'Rotating arm — pre-opening daily check',
    rideClass: 'rotating_arm',
    areas: dailyAreas([look('daily.ride.arm-lock', 'Arm parking lock engages and releases')]),
  },
  {
    name: 'Wheel — pre-opening daily check',
    rideClass: 'wheel',
    areas: dailyAreas([look('daily.ride.doors', 'Every gondola door latches')]),
  },
  {
    name: 'Swing carousel — pre-opening daily check',
    rideClass: 'swing_carousel',
    areas: dailyAreas([look('daily.ride.chains', 'Seat chains hang free, no twisted link')]),
  },
  {
    name: 'Other rotating ride — pre-opening daily check',
    rideClass: 'other',
    areas: dailyAreas([]),
  },
];
