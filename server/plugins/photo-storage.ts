// Chooses the photo driver at start-up, so a wrong S3 setting shows in the log straight away
// rather than at the first photo of the day.
export default defineNitroPlugin(() => {
  choosePhotoStorage()
})
