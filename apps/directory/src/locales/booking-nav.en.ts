// The one booking message the first load needs (the account menu's entry); the rest of the
// booking messages load with the booking pages (loadBookingMessages).
const bookingNavEn = {
  bookings: {
    nav: 'Your bookings',
  },
};

export default bookingNavEn;
