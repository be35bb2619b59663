INSERT INTO `roles` (`name`, `description`) VALUES
  ('buyer', 'Searches, asks questions and buys'),
  ('seller', 'Lists parts for a lab'),
  ('moderator', 'Reviews listings, flags hazards and export-controlled items, handles reports'),
  ('admin', 'Manages users and roles, refunds and platform settings')
ON CONFLICT (`name`) DO NOTHING;
