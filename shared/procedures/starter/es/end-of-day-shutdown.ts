import type { Translations } from '../../translation'
import { homingClear, finalSignoff } from './common-steps'

export const endOfDayShutdown: Translations = {
  es: {
    title: 'Apagar la máquina al acabar el día',
    summary: 'Parar y aparcar la máquina, limpiar el polvo sin riesgo y apagar el husillo, el enfriador, la aspiración y la corriente en el orden correcto.',
    steps: {
      'stop-program': {
        title: 'Termina o para el programa',
        body: 'Deja que termine el último programa, o páralo en un punto seguro. Para el husillo y espera a que deje de girar.',
        guidance: 'El husillo tarda varios segundos en pararse. Espera antes de meter la mano.',
      },
      'parking-clear': homingClear,
      'park': {
        title: 'Aparca el pórtico',
        body: 'Sube Z del todo. Lleva el pórtico a su sitio de aparcar, al fondo de la mesa.',
        guidance: 'Con el pórtico aparcado la mesa queda libre para limpiar y el husillo lejos de quien pase.',
      },
      'remove-tool': {
        title: 'Quita la fresa',
        body: 'Con el husillo apagado, saca la fresa de la pinza. Déjala en su soporte.',
        guidance: 'Con el husillo vacío por la noche, nadie se corta al estirarse sobre la mesa por la mañana.',
      },
      'dust-clean': {
        title: 'Aspira el polvo, nunca lo soples',
        body: 'El polvo fino de madera y de MDF hace daño al respirarlo. Limpia con aspirador, no con aire comprimido, y no te quites la mascarilla.',
        guidance: 'Soplar el polvo con aire comprimido vuelve a meter en el aire durante horas el polvo más fino y más dañino.',
        hazard: 'El polvo de madera es una causa conocida de cáncer nasal, y el polvo de MDF lleva formaldehído. Si lo soplas, acaba en el aire que respiras.',
        avoid: 'Aspira la mesa, las guías, el pórtico y la campana de aspiración. Lleva la mascarilla mientras limpias. Nunca limpies con aire comprimido.',
      },
      'clean-machine': {
        title: 'Limpia la máquina',
        body: 'Aspira la mesa, las guías, el pórtico y la campana de aspiración. Pasa un trapo seco por las guías.',
        guidance: 'El polvo de las guías se mete en los rodamientos y las correas.',
      },
      'collector-empty': {
        title: 'Revisa el colector de polvo',
        body: 'Vacía la bolsa o el cubo del colector si está lleno más de dos tercios. Cierra la compuerta de la máquina.',
        guidance: 'Vaciarlo al final del día hace que el turno siguiente nunca empiece con el colector lleno.',
      },
      'chiller-off': {
        title: 'Apaga el enfriador',
        body: 'Si el husillo es refrigerado por agua, deja el enfriador en marcha unos minutos después de parar el husillo. Luego apágalo. Sáltate esto con otros husillos.',
        guidance: 'Ese rato de más se lleva el último calor del husillo.',
      },
      'power-off': {
        title: 'Apaga la corriente',
        body: 'Cierra el programa del controlador. Apaga la máquina en el seccionador principal. Apaga el colector de polvo.',
        guidance: 'Al apagar en el seccionador nada puede arrancar por la noche.',
      },
      'end-notes': {
        title: 'Apunta cualquier cosa rara',
        body: 'Añade una nota de lo que necesite atención antes de mañana: una fresa gastada, un ruido, una manguera dañada.',
        guidance: 'El arranque de la mañana le enseña estas notas al siguiente.',
      },
      'final-signoff': finalSignoff('La máquina está aparcada, limpia y apagada, la fresa está fuera del husillo y el colector de polvo está listo para mañana.'),
    },
  },
}
