// Geography for bookings: distances, service areas, bounding boxes and travel-time estimates.
export * from './distance';
export * from './travel';
export * from './travel-fee';
export * from './job-placement';
