// The app's entry: Expo Router. zod is not imported here: it loads with the schema kit
// (components/schemas.ts), which sets zod up first.
import 'expo-router/entry';
