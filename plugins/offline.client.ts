// Starts the offline store's watch on the signed-in person (stores/offline.ts). A plugin rather
// than app.vue: the first navigation's route middleware asks the server who is signed in before
// app.vue is set up, and the watch must already be there to see a session that ended elsewhere
// go from that person to no one. Client only: IndexedDB.
export default defineNuxtPlugin(() => {
  useOfflineStore().start()
})
