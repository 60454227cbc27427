// The app's entry: settings that must precede every other module, then Expo Router.
import './components/zod-setup';
import 'expo-router/entry';
